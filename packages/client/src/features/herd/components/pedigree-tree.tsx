import { Link } from 'react-router-dom';
import type { PedigreeCardDto, PedigreeTreeDto } from '@burrowline/shared';
import { cn } from '../../../lib/cn';
import { formatCoi } from '../herd-labels';
import { breedMakeupText } from './breed-makeup';

const generationNames = ['Parents', 'Grandparents', 'Great-grandparents', 'Great-great-grandparents', '4th great-grandparents', '5th great-grandparents'];

/** "Sire", "Dam's sire", "Sire's dam's dam"… from a heap slot (2 = sire, 3 = dam, 2k and 2k + 1 their parents). */
export function slotRole(slot: number): string {
  const steps: string[] = [];
  for (let k = slot; k > 1; k = Math.floor(k / 2)) steps.unshift(k % 2 === 0 ? 'sire' : 'dam');
  const text = steps.map((s, i) => (i < steps.length - 1 ? `${s}'s` : s)).join(' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

function whereFrom(card: PedigreeCardDto): string {
  if (card.isOutside) return card.breederName ? `From papers · ${card.breederName}` : 'From papers';
  if (card.currentFarm) return card.currentFarm.name;
  return card.breedingFarm ? `Bred at ${card.breedingFarm.name}` : 'No longer on a farm';
}

/** Tattoo and registration number, each named, so a number from papers is never read as a tattoo. */
function identifiers(card: PedigreeCardDto): string {
  return [card.tattoo ? `Tattoo ${card.tattoo}` : null, card.registrationNumber ? `Reg. ${card.registrationNumber}` : null].filter(Boolean).join(' · ') || 'No tattoo on record';
}

/** A repeated ancestor's mark: the same letter wherever it appears, so the eye can follow the line that repeats. */
function LineMark({ mark }: { mark: string }) {
  return (
    <span className="absolute top-1.5 right-1.5 inline-flex size-6 items-center justify-center rounded-md bg-bark text-xs font-bold text-oat" title="Appears more than once in this pedigree">
      {mark}
    </span>
  );
}

function PedigreeBox({ card, slot, mark, compact }: { card: PedigreeCardDto | null; slot: number; mark: string | null; compact?: boolean }) {
  const role = slotRole(slot);
  if (!card) {
    return (
      <div className="flex h-full min-h-14 flex-col justify-center rounded-xl border-2 border-dashed border-grey-300 px-3 py-2 text-grey-600">
        <span className="text-xs font-semibold tracking-wide uppercase">{role}</span>
        <span>Unknown</span>
      </div>
    );
  }
  return (
    <div className={cn('relative flex h-full min-h-14 flex-col justify-center rounded-xl border border-grey-200 bg-white px-3 py-2 shadow-sm', mark && 'bg-oat pr-9')}>
      {mark && <LineMark mark={mark} />}
      <span className="text-xs font-semibold tracking-wide text-grey-600 uppercase">
        {role} · {card.sex === 'buck' ? 'buck' : 'doe'}
      </span>
      <Link to={`/herd/${card.id}`} className="font-semibold text-moss-deep underline decoration-1 underline-offset-2 after:absolute after:inset-0">
        {card.name || card.tattoo || 'Unnamed'}
      </Link>
      {!compact && (
        <>
          <span className="text-sm text-grey-700">{identifiers(card)}</span>
          <span className="text-sm">{breedMakeupText(card.breedMakeup)}</span>
        </>
      )}
      <span className="text-sm text-grey-600">{whereFrom(card)}</span>
      {card.coi > 0 && <span className="text-sm font-medium text-clay-deep">COI {formatCoi(card.coi)}</span>}
    </div>
  );
}

/**
 * Our pedigree picture, on the paper convention of the trade (generations left to right, sire above dam):
 * generations side by side on wide screens (each ancestor spanning the rows of its own ancestors), a list
 * by generation on phones. An ancestor that appears more than once — the source of inbreeding — carries
 * the same letter wherever it appears, explained under the picture.
 */
export function PedigreeTree({ tree }: { tree: PedigreeTreeDto }) {
  const generations = tree.generations;
  const rows = 2 ** generations;
  const repeats = new Map<string, number>();
  for (let k = 2; k < tree.slots.length; k++) {
    const id = tree.slots[k];
    if (id) repeats.set(id, (repeats.get(id) ?? 0) + 1);
  }
  const repeated = [...repeats].filter(([, n]) => n > 1).map(([id]) => id);
  const markOf = new Map(repeated.map((id, i) => [id, String.fromCharCode(65 + (i % 26))]));
  const markAt = (slot: number) => (tree.slots[slot] ? (markOf.get(tree.slots[slot]!) ?? null) : null);
  const slotsOf = (g: number) => Array.from({ length: 2 ** g }, (_, i) => 2 ** g + i);
  const cardAt = (slot: number) => {
    const id = tree.slots[slot];
    return id ? (tree.cards[id] ?? null) : null;
  };

  return (
    <div>
      <div
        className="hidden gap-x-3 gap-y-1.5 md:grid"
        style={{ gridTemplateColumns: `repeat(${generations}, minmax(0, 1fr))`, gridTemplateRows: `repeat(${rows}, minmax(2.5rem, auto))` }}
        role="list"
        aria-label="Pedigree"
      >
        {Array.from({ length: generations }, (_, i) => i + 1).flatMap((g) =>
          slotsOf(g).map((slot, i) => (
            <div key={slot} role="listitem" style={{ gridColumn: g, gridRow: `${i * (rows / 2 ** g) + 1} / span ${rows / 2 ** g}` }}>
              <PedigreeBox card={cardAt(slot)} slot={slot} mark={markAt(slot)} compact={g === 4} />
            </div>
          )),
        )}
      </div>
      <div className="space-y-4 md:hidden">
        {Array.from({ length: generations }, (_, i) => i + 1).map((g) => (
          <details key={g} open={g <= 2} className="rounded-xl border border-grey-200 bg-grey-50 p-3">
            <summary className="flex min-h-11 cursor-pointer items-center justify-between font-semibold">
              {generationNames[g - 1]}
              <span className="text-sm font-normal text-grey-600">
                {Math.round((tree.completeness[g - 1] ?? 0) * 100)} % known
              </span>
            </summary>
            <ul className="mt-2 grid grid-cols-1 gap-2 min-[420px]:grid-cols-2">
              {slotsOf(g).map((slot) => (
                <li key={slot}>
                  <PedigreeBox card={cardAt(slot)} slot={slot} mark={markAt(slot)} />
                </li>
              ))}
            </ul>
          </details>
        ))}
      </div>
      {repeated.length > 0 && (
        <ul className="mt-3 space-y-1 text-sm" aria-label="Ancestors that appear more than once">
          {repeated.map((id) => (
            <li key={id} className="flex items-center gap-2">
              <span className="inline-flex size-6 shrink-0 items-center justify-center rounded-md bg-bark text-xs font-bold text-oat">{markOf.get(id)}</span>
              <span>
                <strong>{tree.cards[id]?.name || tree.cards[id]?.tattoo || 'An ancestor'}</strong> appears in {repeats.get(id)} places: the litter's inbreeding comes through this line.
              </span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** How much of the pedigree is known, generation by generation (the share of ancestor places filled). */
export function CompletenessBars({ completeness }: { completeness: number[] }) {
  return (
    <dl className="space-y-1.5 text-sm">
      {completeness.map((value, i) => (
        <div key={i} className="grid grid-cols-[9.5rem_1fr_3rem] items-center gap-2">
          <dt className="text-grey-700">{generationNames[i]}</dt>
          <dd className="contents">
            <span className="h-2.5 overflow-hidden rounded-full bg-grey-100" aria-hidden="true">
              <span className="block h-full rounded-full bg-moss" style={{ width: `${value * 100}%` }} />
            </span>
            <span className="text-right font-semibold">{Math.round(value * 100)} %</span>
          </dd>
        </div>
      ))}
    </dl>
  );
}
