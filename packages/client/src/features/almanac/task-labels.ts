import type { AlmanacTaskDto } from '@burrowline/shared';
import type { BadgeTone } from '../../components/ui/badge';

/** How a task stands, in words (the colour only helps). */
export function taskStatus(task: AlmanacTaskDto): { label: string; tone: BadgeTone } {
  if (task.state === 'done' && task.completionReview === 'pending') return { label: 'Done · waiting for review', tone: 'straw' };
  if (task.state === 'done') return { label: 'Done', tone: 'moss' };
  if (task.state === 'skipped') return { label: 'Skipped', tone: 'neutral' };
  if (task.completionReview === 'returned') return { label: 'Returned by the mentor', tone: 'clay' };
  if (task.timing === 'overdue') return { label: task.daysLate === 1 ? '1 day late' : `${task.daysLate} days late`, tone: 'clay' };
  if (task.timing === 'due_today') return { label: 'Today', tone: 'straw' };
  if (task.state === 'moved') return { label: 'Moved', tone: 'neutral' };
  return { label: 'Planned', tone: 'neutral' };
}

export function isOpen(task: Pick<AlmanacTaskDto, 'state'>): boolean {
  return task.state === 'open' || task.state === 'moved';
}
