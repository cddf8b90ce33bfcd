import { Link } from 'react-router-dom';
import { doeLabel, type TaskAttention } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';

/** The message with the doe's name as a link to her page (the message starts with her name when it names her). */
function AttentionMessage({ item }: { item: TaskAttention }) {
  if (!item.doe) return <>{item.message}</>;
  const name = doeLabel(item.doe);
  const rest = item.message.startsWith(`${name}: `) ? item.message.slice(name.length + 2) : item.message;
  return (
    <>
      <Link to={`/herd/${item.doe.id}`} className="font-semibold underline underline-offset-2 hover:text-moss">
        {name}
      </Link>
      : {rest}
    </>
  );
}

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
          <li key={item.taskId}>
            <AttentionMessage item={item} />
          </li>
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
