import { useWithdrawals } from '../api/get-withdrawals';
import { WithdrawalLine } from './withdrawals-card';

/** "Under withdrawal until …" for one grow-out group or animal (the group and animal screens include it). */
export function WithdrawalStatus({ animalId, groupId }: { animalId?: string; groupId?: string }) {
  const state = useWithdrawals({ animalId, groupId });
  if (!state.data) return null;
  return <WithdrawalLine withdrawals={state.data.withdrawals} />;
}
