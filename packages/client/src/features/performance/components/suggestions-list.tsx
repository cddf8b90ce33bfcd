import { Link } from 'react-router-dom';
import type { SuggestionAction, SuggestionRow } from '@burrowline/shared';
import { cn } from '../../../lib/cn';

/** What the reasons add up to, said after them in plain words (the breeder weighs the reasons, not a label). */
const conclusions: Record<SuggestionAction, { words: string; rule: string }> = {
  consider_culling: { words: 'so she may be worth replacing', rule: 'border-clay' },
  watch: { words: 'so she is worth watching', rule: 'border-straw-deep' },
  keep: { words: 'so she is earning her place', rule: 'border-moss' },
  too_early: { words: 'so it is too early to judge her', rule: 'border-grey-300' },
};

/**
 * Keep and cull suggestions for the does still on the farm, each with its reasons. Suggestions only:
 * nothing here changes an animal; the breeder decides on the animal's own page.
 */
export function SuggestionsList({ suggestions }: { suggestions: SuggestionRow[] }) {
  if (suggestions.length === 0) return <p className="text-grey-600">No does on the farm with records in this period.</p>;
  return (
    <ul>
      {suggestions.map((s) => {
        const conclusion = conclusions[s.suggestions[0]!.action];
        return (
          <li key={s.animal.id} className={cn('my-2 border-l-4 py-1 pl-3', conclusion.rule)}>
            <Link to={`/herd/${s.animal.id}`} className="inline-flex min-h-11 items-center font-semibold text-moss-deep underline underline-offset-4">
              {s.animal.name || 'Unnamed'}{s.animal.tattoo ? ` (${s.animal.tattoo})` : ''}
            </Link>
            <p className="text-bark">
              {s.suggestions.map((x) => x.reason.replace(/\.$/, '')).join('; ')}
              {s.suggestions[0]!.action === 'too_early' ? '.' : <>, <em className="font-semibold not-italic">{conclusion.words}</em>.</>}
            </p>
          </li>
        );
      })}
    </ul>
  );
}
