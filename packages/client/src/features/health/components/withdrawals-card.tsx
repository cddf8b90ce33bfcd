import type { WithdrawalDto } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';
import { subjectName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';

/** What is under a veterinarian's withdrawal today: it may be neither marked for processing nor processed until it clears. */
export function WithdrawalsCard({ withdrawals }: { withdrawals: WithdrawalDto[] }) {
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Under withdrawal now</h2>
      {withdrawals.length === 0 ? (
        <p className="text-grey-600">Nothing is under withdrawal today.</p>
      ) : (
        <ul className="divide-y divide-grey-200">
          {withdrawals.map((w) => (
            <li key={w.treatmentId} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 py-3">
              <span>
                <strong>{subjectName(w)}</strong>: {w.treatment}
                {w.veterinarian ? <span className="text-grey-600"> (set by {w.veterinarian})</span> : null}
              </span>
              <span className="font-semibold text-clay-deep">
                until {formatDate(w.withdrawalEndsOn)} <span className="font-normal text-grey-600">· may be processed from {formatDate(w.clearFrom)}</span>
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

/**
 * One animal's or group's withdrawal line, for the group and animal screens ("Under withdrawal until …"):
 * nothing when it is clear.
 */
export function WithdrawalLine({ withdrawals }: { withdrawals: WithdrawalDto[] }) {
  const w = withdrawals[0];
  if (!w) return null;
  return (
    <p role="status" className="rounded-xl border-2 border-clay/40 bg-clay-wash px-4 py-3 text-bark">
      <strong className="text-clay-deep">Under withdrawal until {formatDate(w.withdrawalEndsOn)}</strong> ({w.treatment}
      {w.veterinarian ? `, set by ${w.veterinarian}` : ''}): not to be marked for processing or processed before {formatDate(w.clearFrom)}.
    </p>
  );
}
