/**
 * Dress-out: carcass weight as a percentage of live weight, for the hot carcass (just dressed) and the
 * chilled one. The usual range for meat rabbits, and where its edges come from:
 * - below 50 %: MSU Extension 4-H Rabbit Tracks 4H1508, "a fryer carcass should exceed half the live weight";
 * - published figures: 55–56 % head-on (51–52 % head-off) for Cal×NZ at 77 days, Kuzelov & Atanasova 2011;
 *   ≈ 60 % for NZW/Cal at 14–16 weeks, fasted, Nofal, Toth & Virag, World Rabbit Science;
 * - above 65 %: well past every published figure (common practice: check the weights or what was left on).
 */
export const DRESS_OUT_USUAL = Object.freeze({
  minPercent: 50,
  maxPercent: 65,
  minSource: 'MSU Extension 4-H Rabbit Tracks 4H1508: a fryer carcass should exceed half the live weight',
  maxSource: 'common practice: above every published figure (Kuzelov & Atanasova 2011: 55–56 %; Nofal, Toth & Virag: ≈ 60 %)',
});

export interface YieldFlag {
  level: 'error' | 'warning';
  code:
    | 'not_positive'
    | 'carcass_heavier_than_live'
    | 'below_usual'
    | 'above_usual'
    | 'chilled_heavier_than_hot';
  field: 'liveGrams' | 'hotCarcassGrams' | 'chilledCarcassGrams';
  message: string;
}

/** Carcass ÷ live × 100. */
export function dressOutPercent(carcassGrams: number, liveGrams: number): number {
  if (!(liveGrams > 0) || !Number.isFinite(liveGrams)) throw new RangeError('The live weight must be above zero');
  if (!(carcassGrams > 0) || !Number.isFinite(carcassGrams)) throw new RangeError('The carcass weight must be above zero');
  return (carcassGrams / liveGrams) * 100;
}

export interface DressOutInput {
  liveGrams: number;
  hotCarcassGrams?: number | null;
  chilledCarcassGrams?: number | null;
}

export interface DressOutResult {
  hotPercent: number | null;
  chilledPercent: number | null;
  /** Weight lost in chilling, % of the hot carcass (negative when the chilled one weighs more). */
  chillLossPercent: number | null;
  flags: YieldFlag[];
  /** True when any flag is an error: the record is refused. */
  invalid: boolean;
}

/**
 * Dress-out of one animal or a batch (totals), hot and chilled, with flags: a carcass heavier than the
 * live animal is an error; figures outside 50–65 % are warnings; a chilled carcass heavier than the hot
 * one is a warning (water taken up in an ice bath).
 */
export function dressOut(input: DressOutInput): DressOutResult {
  const flags: YieldFlag[] = [];
  const positive = (v: number | null | undefined) => v === null || v === undefined || (Number.isFinite(v) && v > 0);
  if (!(Number.isFinite(input.liveGrams) && input.liveGrams > 0)) {
    flags.push({ level: 'error', code: 'not_positive', field: 'liveGrams', message: 'The live weight must be above zero' });
  }
  if (!positive(input.hotCarcassGrams)) {
    flags.push({ level: 'error', code: 'not_positive', field: 'hotCarcassGrams', message: 'The hot carcass weight must be above zero' });
  }
  if (!positive(input.chilledCarcassGrams)) {
    flags.push({ level: 'error', code: 'not_positive', field: 'chilledCarcassGrams', message: 'The chilled carcass weight must be above zero' });
  }
  if (flags.length > 0) return { hotPercent: null, chilledPercent: null, chillLossPercent: null, flags, invalid: true };

  const hot = input.hotCarcassGrams ?? null;
  const chilled = input.chilledCarcassGrams ?? null;
  const judge = (grams: number | null, field: 'hotCarcassGrams' | 'chilledCarcassGrams', word: string): number | null => {
    if (grams === null) return null;
    if (grams > input.liveGrams) {
      flags.push({ level: 'error', code: 'carcass_heavier_than_live', field, message: `The ${word} carcass (${grams} g) weighs more than the live animal (${input.liveGrams} g)` });
      return null;
    }
    const percent = dressOutPercent(grams, input.liveGrams);
    if (percent < DRESS_OUT_USUAL.minPercent) {
      flags.push({ level: 'warning', code: 'below_usual', field, message: `${word[0]!.toUpperCase()}${word.slice(1)} dress-out ${percent.toFixed(1)} % is below half the live weight; check the weights` });
    } else if (percent > DRESS_OUT_USUAL.maxPercent) {
      flags.push({ level: 'warning', code: 'above_usual', field, message: `${word[0]!.toUpperCase()}${word.slice(1)} dress-out ${percent.toFixed(1)} % is above the usual range (up to ${DRESS_OUT_USUAL.maxPercent} %); check the weights` });
    }
    return percent;
  };
  const hotPercent = judge(hot, 'hotCarcassGrams', 'hot');
  const chilledPercent = judge(chilled, 'chilledCarcassGrams', 'chilled');
  if (hot !== null && chilled !== null && chilled > hot) {
    flags.push({ level: 'warning', code: 'chilled_heavier_than_hot', field: 'chilledCarcassGrams', message: 'The chilled carcass weighs more than the hot one: water taken up in an ice bath?' });
  }
  return {
    hotPercent,
    chilledPercent,
    chillLossPercent: hot !== null && chilled !== null ? ((hot - chilled) / hot) * 100 : null,
    flags,
    invalid: flags.some((f) => f.level === 'error'),
  };
}
