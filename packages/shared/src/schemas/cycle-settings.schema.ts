import { z } from 'zod';
import { CYCLE_SETTING_LIMITS, type CycleSettings } from '../breeding/cycle-settings';

const limits = CYCLE_SETTING_LIMITS;

function dayCount(what: string, { min, max }: { min: number; max: number }) {
  return z
    .number({ message: `${what}: enter a number of days` })
    .int(`${what}: whole days only`)
    .min(min, `${what}: at least ${min} days`)
    .max(max, `${what}: at most ${max} days`);
}

const fields = {
  palpationDays: dayCount('Palpation after service', limits.palpationDays),
  nestBoxInDays: dayCount('Nest box in after service', limits.nestBoxInDays),
  kindlingExpectedDays: dayCount('Expected kindling after service', limits.kindlingExpectedDays),
  kindlingWindowStartDays: dayCount('Start of the kindling window', limits.kindlingWindowStartDays),
  kindlingWindowEndDays: dayCount('End of the kindling window', limits.kindlingWindowEndDays),
  kindlingOverdueDays: dayCount('Overdue kindling alert', limits.kindlingOverdueDays),
  nestBoxOutDays: dayCount('Nest box out after kindling', limits.nestBoxOutDays),
  weaningDays: dayCount('Weaning age', limits.weaningDays),
  breedBackDays: dayCount('Breeding back after kindling', limits.breedBackDays),
  rebreedAfterNegativeDays: dayCount('Rebreed after a negative palpation', limits.rebreedAfterNegativeDays),
  weighInAgesDays: z
    .array(dayCount('Weigh-in age', limits.weighInAgesDays), { message: 'List the weigh-in ages in days' })
    .min(1, 'Keep at least one weigh-in age')
    .max(limits.weighInAgesDays.maxCount, `At most ${limits.weighInAgesDays.maxCount} weigh-in ages`),
  targetLiveWeightGrams: z
    .number({ message: 'Target live weight: enter grams' })
    .int('Target live weight: whole grams only')
    .min(limits.targetLiveWeightGrams.min, `Target live weight: at least ${limits.targetLiveWeightGrams.min} g`)
    .max(limits.targetLiveWeightGrams.max, `Target live weight: at most ${limits.targetLiveWeightGrams.max} g`),
};

/** The order of the days that must hold between the settings, checked on the whole set. */
function checkOrder(v: CycleSettings, ctx: z.RefinementCtx): void {
  const issue = (path: keyof CycleSettings, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
  if (v.palpationDays >= v.nestBoxInDays) issue('palpationDays', 'Palpate before the nest box goes in');
  if (v.nestBoxInDays > v.kindlingWindowStartDays) issue('nestBoxInDays', 'Put the nest box in by the first day of the kindling window');
  if (v.kindlingWindowStartDays > v.kindlingExpectedDays) issue('kindlingWindowStartDays', 'The kindling window must open on or before the expected day');
  if (v.kindlingExpectedDays > v.kindlingWindowEndDays) issue('kindlingWindowEndDays', 'The kindling window must close on or after the expected day');
  if (v.kindlingOverdueDays <= v.kindlingExpectedDays) issue('kindlingOverdueDays', 'The overdue alert comes after the expected kindling day');
  if (v.kindlingOverdueDays > v.kindlingWindowEndDays) issue('kindlingOverdueDays', 'The overdue alert must fall inside the kindling window');
  if (v.nestBoxOutDays > v.weaningDays) issue('nestBoxOutDays', 'Take the nest box out by weaning');
  for (let i = 1; i < v.weighInAgesDays.length; i++) {
    if (v.weighInAgesDays[i]! <= v.weighInAgesDays[i - 1]!) {
      issue('weighInAgesDays', 'List each weigh-in age once, youngest first');
      break;
    }
  }
}

/** A farm's whole cycle settings, as stored and as the settings form sends them. */
export const cycleSettingsSchema = z.strictObject(fields).superRefine(checkOrder);
export type CycleSettingsInput = z.infer<typeof cycleSettingsSchema>;

/**
 * A change to some settings, with the version the editor saw (two members of a farm may edit at once).
 * The service merges it into the stored settings and checks the result with `cycleSettingsSchema`, so
 * the order rules apply to the whole set.
 */
export const cycleSettingsPatchSchema = z
  .strictObject({ ...fields, version: z.number({ message: 'Send the version you edited' }).int().min(0) })
  .partial({
    palpationDays: true, nestBoxInDays: true, kindlingExpectedDays: true, kindlingWindowStartDays: true, kindlingWindowEndDays: true,
    kindlingOverdueDays: true, nestBoxOutDays: true, weaningDays: true, breedBackDays: true, rebreedAfterNegativeDays: true,
    weighInAgesDays: true, targetLiveWeightGrams: true,
  });
export type CycleSettingsPatchInput = z.infer<typeof cycleSettingsPatchSchema>;
