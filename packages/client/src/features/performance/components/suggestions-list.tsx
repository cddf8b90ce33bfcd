import { Link } from 'react-router-dom';
import type { SuggestionAction, SuggestionRow } from '@burrowline/shared';
import { Badge, type BadgeTone } from '../../../components/ui/badge';

const words: Record<SuggestionAction, { label: string; tone: BadgeTone }> = {
  consider_culling: { label: 'Consider culling', tone: 'clay' },
  watch: { label: 'Watch', tone: 'straw' },
  keep: { label: 'Keep', tone: 'moss' },
  too_early: { label: 'Too early to say', tone: 'neutral' },
};

/**
 * Keep and cull suggestions for the does still on the farm, each with its reasons. Suggestions only:
 * nothing here changes an animal; the breeder decides on the animal's own page.
 */
export function SuggestionsList({ suggestions }: { suggestions: SuggestionRow[] }) {
  if (suggestions.length === 0) return <p className="text-grey-600">No does on the farm with records in this period.</p>;
  return (
    <ul className="divide-y divide-grey-200">
      {suggestions.map((s) => {
        const first = words[s.suggestions[0]!.action];
        return (
          <li key={s.animal.id} className="flex flex-col gap-2 py-3 sm:flex-row sm:items-start sm:gap-4">
            <div className="flex min-w-48 items-center gap-2">
              <Badge tone={first.tone}>{first.label}</Badge>
              <Link to={`/herd/${s.animal.id}`} className="inline-flex min-h-11 items-center font-semibold text-moss-deep underline underline-offset-4">
                {s.animal.name || 'Unnamed'}{s.animal.tattoo ? ` (${s.animal.tattoo})` : ''}
              </Link>
            </div>
            <ul className="list-disc space-y-1 pl-5 text-bark sm:pt-2">
              {s.suggestions.map((x) => <li key={x.code}>{x.reason}</li>)}
            </ul>
          </li>
        );
      })}
    </ul>
  );
}
