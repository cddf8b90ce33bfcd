import { useWithdrawals } from '../../health';
import { WithdrawalLine } from '../../health';
import { MarkForProcessing } from './mark-for-processing';

/**
 * For the grow-out group and animal screens: "Under withdrawal until …" when a veterinarian's withdrawal
 * runs, and the "Mark for processing" action (members; refused with the reason under withdrawal).
 */
export function ProcessingActions({ animalId, groupId, canMark }: { animalId?: string; groupId?: string; canMark: boolean }) {
  const state = useWithdrawals({ animalId, groupId });
  if (!state.data) return null;
  return (
    <div className="space-y-3">
      <WithdrawalLine withdrawals={state.data.withdrawals} />
      {canMark && <MarkForProcessing animalId={animalId} groupId={groupId} today={state.data.today} />}
    </div>
  );
}
