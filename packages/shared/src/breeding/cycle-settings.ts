import type { Confidence } from '../herd/herd-enums';
import { poundsToGrams } from '../units/units';

/**
 * A farm's own breeding cycle: how many days after a service (or after a kindling) each job falls.
 * Every figure is editable per farm; each default below carries the range published for it and the
 * publication it comes from, so the settings screen can show both.
 */
export interface CycleSettings {
  /** Palpation, days after the service. */
  palpationDays: number;
  /** Nest box in, days after the service. */
  nestBoxInDays: number;
  /** The expected kindling, days after the service. */
  kindlingExpectedDays: number;
  /** The kindling window, first and last day after the service. */
  kindlingWindowStartDays: number;
  kindlingWindowEndDays: number;
  /** No kits by this day after the service → the overdue alert. */
  kindlingOverdueDays: number;
  /** Nest box out, days after the kindling. */
  nestBoxOutDays: number;
  /** Weaning, days after the kindling. */
  weaningDays: number;
  /** Breeding back, days after the kindling. */
  breedBackDays: number;
  /** The rebreed task, days after a negative palpation. */
  rebreedAfterNegativeDays: number;
  /** Weigh-ins of the litter or grow-out group, ages in days, youngest first. */
  weighInAgesDays: ReadonlyArray<number>;
  /** Target fryer live weight in grams. */
  targetLiveWeightGrams: number;
}

export type CycleSettingKey = keyof CycleSettings;

export interface CycleSettingSource {
  /** What the day count is measured from. */
  from: 'service' | 'kindling' | 'negative palpation' | 'birth' | null;
  unit: 'days' | 'grams';
  /** The published range, when there is one (days or grams, as `unit`). */
  published: { min: number; max: number } | null;
  /** How the published range is usually written, e.g. "4–8 weeks". */
  publishedText: string;
  source: string;
  confidence: Confidence;
}

export const DEFAULT_CYCLE_SETTINGS: Readonly<CycleSettings> = Object.freeze({
  palpationDays: 12,
  nestBoxInDays: 28,
  kindlingExpectedDays: 31,
  kindlingWindowStartDays: 29,
  kindlingWindowEndDays: 35,
  kindlingOverdueDays: 32,
  nestBoxOutDays: 21,
  weaningDays: 42,
  breedBackDays: 35,
  rebreedAfterNegativeDays: 1,
  weighInAgesDays: Object.freeze([28, 42, 56, 70]),
  targetLiveWeightGrams: 2270,
});

/** Where each default comes from: the publication and how sure we are of the figure. */
export const CYCLE_SETTING_SOURCES: Readonly<Record<CycleSettingKey, CycleSettingSource>> = Object.freeze({
  palpationDays: {
    from: 'service', unit: 'days', published: { min: 10, max: 14 }, publishedText: 'day 10–14 (day 12 common)',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020; McNitt et al., Rabbit Production, 9th ed., CABI 2013',
    confidence: 'pub',
  },
  nestBoxInDays: {
    from: 'service', unit: 'days', published: { min: 28, max: 29 }, publishedText: 'day 28–29',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020', confidence: 'pub',
  },
  kindlingExpectedDays: {
    from: 'service', unit: 'days', published: { min: 31, max: 32 }, publishedText: '31–32 days typical',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020', confidence: 'pub',
  },
  kindlingWindowStartDays: {
    from: 'service', unit: 'days', published: { min: 29, max: 35 }, publishedText: 'gestation 29–35 days',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020', confidence: 'pub',
  },
  kindlingWindowEndDays: {
    from: 'service', unit: 'days', published: { min: 29, max: 35 }, publishedText: 'gestation 29–35 days',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020', confidence: 'pub',
  },
  kindlingOverdueDays: {
    from: 'service', unit: 'days', published: { min: 32, max: 32 }, publishedText: 'no kits by day 32 → watch; the vet may induce',
    source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits", 2020', confidence: 'pub',
  },
  nestBoxOutDays: {
    from: 'kindling', unit: 'days', published: { min: 15, max: 21 }, publishedText: '15–21 days after kindling',
    source: 'McNitt et al., Rabbit Production, 9th ed., CABI 2013', confidence: 'pub',
  },
  weaningDays: {
    from: 'kindling', unit: 'days', published: { min: 28, max: 56 }, publishedText: '4–8 weeks',
    source: 'Texas Agricultural Extension Service, Backyard Production of Meat Rabbits in Texas; McNitt et al., Rabbit Production, 9th ed.',
    confidence: 'pub',
  },
  breedBackDays: {
    from: 'kindling', unit: 'days', published: { min: 7, max: 42 }, publishedText: '7, 14, 21, 28, 35 or 42 days are all in use',
    source: 'McNitt et al., Rabbit Production, 9th ed.; Texas Agricultural Extension Service', confidence: 'pub',
  },
  rebreedAfterNegativeDays: {
    from: 'negative palpation', unit: 'days', published: null,
    publishedText: 'rebreed as soon as she palpates empty; a pseudopregnant doe ≈ day 18 after the first service (Rabbit Production, 9th ed.)',
    source: 'common practice', confidence: 'common_practice',
  },
  weighInAgesDays: {
    from: 'birth', unit: 'days', published: null,
    publishedText: '4, 6, 8 and 10 weeks: weaning in research herds (28 d), the 8-week fryer weight, and 8–10 weeks to market',
    source: 'common practice (ages chosen to meet Rao et al. 1977 at 8 weeks and Oregon State Ext. Bulletin 745 at 8–10 weeks)',
    confidence: 'common_practice',
  },
  targetLiveWeightGrams: {
    from: null, unit: 'grams', published: { min: Math.round(poundsToGrams(4)), max: Math.round(poundsToGrams(5)) },
    publishedText: '4–5 lb live at 8 weeks (the default 2,270 g is 5 lb to the nearest 10 g)',
    source: 'common practice (5 lb); Oregon State Univ. Ext. Bulletin 745 (Bogart, 1962): 4–5 lb at 8 weeks',
    confidence: 'common_practice',
  },
});

/**
 * Hard limits for editing (wider than the published ranges: a breeder may know better, but a palpation
 * on day 40 or a weaning at 2 days is a typing slip). The schema in schemas/cycle-settings.schema.ts
 * enforces them.
 */
export const CYCLE_SETTING_LIMITS: Readonly<Record<Exclude<CycleSettingKey, 'weighInAgesDays'>, { min: number; max: number }>> & {
  weighInAgesDays: { min: number; max: number; maxCount: number };
} = Object.freeze({
  palpationDays: { min: 7, max: 21 },
  nestBoxInDays: { min: 20, max: 31 },
  kindlingExpectedDays: { min: 28, max: 35 },
  kindlingWindowStartDays: { min: 25, max: 35 },
  kindlingWindowEndDays: { min: 29, max: 40 },
  kindlingOverdueDays: { min: 29, max: 40 },
  nestBoxOutDays: { min: 7, max: 35 },
  weaningDays: { min: 21, max: 70 },
  breedBackDays: { min: 1, max: 70 },
  rebreedAfterNegativeDays: { min: 0, max: 14 },
  weighInAgesDays: { min: 1, max: 365, maxCount: 12 },
  targetLiveWeightGrams: { min: 900, max: 6000 },
});

/** A copy of the defaults that can be changed freely. */
export function defaultCycleSettings(): CycleSettings & { weighInAgesDays: number[] } {
  return { ...DEFAULT_CYCLE_SETTINGS, weighInAgesDays: [...DEFAULT_CYCLE_SETTINGS.weighInAgesDays] };
}

/**
 * Whether a farm's value lies outside the published range (shown beside the field as a note, never a
 * refusal). `null` when there is no published range.
 */
export function outsidePublishedRange(key: CycleSettingKey, value: number): 'below' | 'above' | 'within' | null {
  const { published, unit } = CYCLE_SETTING_SOURCES[key];
  if (!published) return null;
  // Weights are entered to the nearest 10 g, so a published pound figure is compared at that precision.
  const slack = unit === 'grams' ? 5 : 0;
  if (value < published.min - slack) return 'below';
  if (value > published.max + slack) return 'above';
  return 'within';
}
