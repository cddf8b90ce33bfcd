import type { CautionDto } from '@burrowline/shared';
import { Flame, Hand, HandHeart, Landmark, ShieldAlert, Slice, Snowflake, TriangleAlert } from 'lucide-react';

const icons: Record<string, typeof Slice> = { knives: Slice, dispatch: HandHeart, tularemia: Hand, chill: Snowflake, cooking: Flame, selling: Landmark };

/**
 * The day's cautions in one block: the titles read at a glance (gloved, on the site), the reasons and their
 * sources one tap away. Local codes and licensed practice come first.
 */
export function DayCautions({ cautions }: { cautions: CautionDto[] }) {
  return (
    <section aria-labelledby="day-cautions-title" className="rounded-2xl border-2 border-straw bg-straw-wash p-4" data-testid="day-cautions">
      <h2 id="day-cautions-title" className="flex items-center gap-2 text-lg font-bold text-bark">
        <TriangleAlert className="size-5 shrink-0" aria-hidden="true" />
        Safe processing
      </h2>
      <ul className="mt-2 grid gap-x-6 gap-y-1.5 md:grid-cols-2">
        {cautions.map((c) => {
          const Icon = icons[c.id] ?? ShieldAlert;
          return (
            <li key={c.id} className="flex items-start gap-2.5 font-medium text-bark">
              <Icon className="mt-0.5 size-5 shrink-0 text-straw-deep" aria-hidden="true" />
              <span>{c.title}</span>
            </li>
          );
        })}
      </ul>
      <details className="mt-2">
        <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold text-moss-deep">Why, and the sources</summary>
        <dl className="mt-1 space-y-2 text-sm">
          {cautions.map((c) => (
            <div key={c.id}>
              <dt className="font-semibold">{c.title}</dt>
              <dd>{c.text} <span className="text-grey-600">({c.source})</span></dd>
            </div>
          ))}
        </dl>
      </details>
    </section>
  );
}
