import { daysBetween } from '../herd/herd-dates';

/**
 * A doe's breeding record in figures: what her services and litters add up to. Pure, so the figures a
 * test works out by hand are the ones her page shows.
 */

/** Why kits died with the doe: counted per doe, so a doe who loses litters to the same cause stands out. */
export const kitDeathCauses = ['chilled', 'trampled', 'not_nursed', 'born_weak', 'illness', 'predator', 'unknown', 'other'] as const;
export type KitDeathCause = (typeof kitDeathCauses)[number];

export const KIT_DEATH_CAUSE_LABELS: Readonly<Record<KitDeathCause, string>> = Object.freeze({
  chilled: 'Chilled',
  trampled: 'Trampled or smothered',
  not_nursed: 'Not nursed',
  born_weak: 'Born weak',
  illness: 'Illness',
  predator: 'Predator or injury',
  unknown: 'Cause unknown',
  other: 'Other',
});

export interface RecordService {
  servicedOn: string;
  status: 'open' | 'kindled' | 'empty' | 'missed';
}

export interface RecordLitter {
  kindledOn: string;
  bornAlive: number;
  bornDead: number;
  fosteredIn: number;
  fosteredOut: number;
  lost: number;
  culled: number;
  weaned: number;
  /** Total weight of the kits weaned, when weighed. */
  weaningWeightGrams: number | null;
  /** Kits whose weaning weight was recorded (the weight is per kit over these). */
  weighedKits: number;
  deaths: Partial<Record<KitDeathCause, number>>;
}

export interface BreedingRecordFigures {
  services: number;
  /** Services that ended in a litter. */
  conceptions: number;
  /** Conceptions over services that have an outcome (open ones are not yet known), 0–1. */
  conceptionRate: number | null;
  litters: number;
  bornAlive: number;
  bornDead: number;
  fosteredIn: number;
  fosteredOut: number;
  lost: number;
  culled: number;
  weaned: number;
  bornAlivePerLitter: number | null;
  weanedPerLitter: number | null;
  /** Kits weaned over kits she raised (born alive + fostered in − fostered out), litters done only, 0–1. */
  survivalToWeaning: number | null;
  /** Mean weaning weight of a kit, over litters weighed at weaning. */
  weaningGramsPerKit: number | null;
  /** Mean days from one kindling to the next. */
  kindlingIntervalDays: number | null;
  deaths: Record<KitDeathCause, number>;
}

const mean = (total: number, count: number) => (count > 0 ? total / count : null);

export function breedingRecordFigures(services: ReadonlyArray<RecordService>, litters: ReadonlyArray<RecordLitter>): BreedingRecordFigures {
  const decided = services.filter((s) => s.status !== 'open');
  const conceptions = services.filter((s) => s.status === 'kindled').length;
  const sum = (pick: (l: RecordLitter) => number) => litters.reduce((n, l) => n + pick(l), 0);
  const deaths = Object.fromEntries(kitDeathCauses.map((c) => [c, 0])) as Record<KitDeathCause, number>;
  for (const l of litters) for (const [cause, n] of Object.entries(l.deaths)) deaths[cause as KitDeathCause] += n ?? 0;
  // Only litters with every kit accounted for (none left on the doe) say how many of hers survived.
  const done = litters.filter((l) => l.bornAlive + l.fosteredIn - l.fosteredOut - l.lost - l.culled - l.weaned <= 0 && l.weaned > 0);
  const raisedDone = done.reduce((n, l) => n + l.bornAlive + l.fosteredIn - l.fosteredOut, 0);
  const weighed = litters.filter((l) => l.weaningWeightGrams != null && l.weighedKits > 0);
  const kindlings = litters.map((l) => l.kindledOn).sort();
  const gaps = kindlings.slice(1).map((on, i) => daysBetween(kindlings[i]!, on));
  return {
    services: services.length,
    conceptions,
    conceptionRate: decided.length > 0 ? decided.filter((s) => s.status === 'kindled').length / decided.length : null,
    litters: litters.length,
    bornAlive: sum((l) => l.bornAlive),
    bornDead: sum((l) => l.bornDead),
    fosteredIn: sum((l) => l.fosteredIn),
    fosteredOut: sum((l) => l.fosteredOut),
    lost: sum((l) => l.lost),
    culled: sum((l) => l.culled),
    weaned: sum((l) => l.weaned),
    bornAlivePerLitter: mean(sum((l) => l.bornAlive), litters.length),
    weanedPerLitter: mean(done.reduce((n, l) => n + l.weaned, 0), done.length),
    survivalToWeaning: raisedDone > 0 ? done.reduce((n, l) => n + l.weaned, 0) / raisedDone : null,
    weaningGramsPerKit: mean(weighed.reduce((n, l) => n + l.weaningWeightGrams!, 0), weighed.reduce((n, l) => n + l.weighedKits, 0)),
    kindlingIntervalDays: mean(gaps.reduce((n, g) => n + g, 0), gaps.length),
    deaths,
  };
}
