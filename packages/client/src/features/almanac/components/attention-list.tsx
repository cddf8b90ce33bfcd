import type { TaskAttention } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';

/** The late jobs that matter most, surfaced by themselves (other late tasks show in the lists as late). */
const surfaced = new Set<TaskAttention['kind']>(['missed_palpation', 'kindling_overdue', 'kindling_missed', 'late_weaning']);

/** What surfaces by itself: missed palpations, kindlings overdue or past their window, late weanings. */
export function AttentionList({ items: all }: { items: TaskAttention[] }) {
  const items = all.filter((i) => surfaced.has(i.kind));
  if (items.length === 0) return null;
  const kindling = items.some((i) => i.kind === 'kindling_overdue' || i.kind === 'kindling_missed');
  return (
    <Alert tone="warning" title={items.length === 1 ? 'One thing needs attention' : `${items.length} things need attention`}>
      <ul className="list-disc space-y-1 pl-5">
        {items.slice(0, 8).map((item) => (
          <li key={item.taskId}>{item.message}</li>
        ))}
      </ul>
      {kindling && (
        <p className="mt-2 text-sm">
          A doe past her due date needs watching; inducing is a veterinarian's call. Heavily pregnant does suffer most above about 85 °F (29 °C).
        </p>
      )}
    </Alert>
  );
}
