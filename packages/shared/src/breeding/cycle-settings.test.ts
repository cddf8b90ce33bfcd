import { describe, expect, it } from 'vitest';
import { cycleSettingsPatchSchema, cycleSettingsSchema } from '../schemas/cycle-settings.schema';
import { CYCLE_SETTING_SOURCES, DEFAULT_CYCLE_SETTINGS, defaultCycleSettings, outsidePublishedRange } from './cycle-settings';

const messages = (input: unknown) => {
  const result = cycleSettingsSchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
};

describe('cycle settings', () => {
  it('when the defaults are checked by the schema, then they pass', () => {
    expect(cycleSettingsSchema.parse(defaultCycleSettings())).toEqual(DEFAULT_CYCLE_SETTINGS);
  });

  it('when the defaults are copied, then changing the copy leaves the defaults alone', () => {
    const copy = defaultCycleSettings();
    copy.weighInAgesDays.push(84);
    expect(DEFAULT_CYCLE_SETTINGS.weighInAgesDays).toEqual([28, 42, 56, 70]);
    expect(Object.isFrozen(DEFAULT_CYCLE_SETTINGS)).toBe(true);
  });

  it('when every setting has a source, then none is left without one', () => {
    for (const key of Object.keys(DEFAULT_CYCLE_SETTINGS)) {
      expect(CYCLE_SETTING_SOURCES[key as keyof typeof CYCLE_SETTING_SOURCES].source.length).toBeGreaterThan(5);
    }
  });

  it('when a value is out of bounds or not whole, then the message names the setting and the bound', () => {
    expect(messages({ ...defaultCycleSettings(), palpationDays: 40 })).toContain('palpationDays: Palpation after service: at most 21 days');
    expect(messages({ ...defaultCycleSettings(), weaningDays: 42.5 })).toContain('weaningDays: Weaning age: whole days only');
    expect(messages({ ...defaultCycleSettings(), targetLiveWeightGrams: 200 })).toContain('targetLiveWeightGrams: Target live weight: at least 900 g');
    expect(messages({ ...defaultCycleSettings(), weighInAgesDays: [] })).toContain('weighInAgesDays: Keep at least one weigh-in age');
  });

  it('when the days are out of order, then each rule says which', () => {
    expect(messages({ ...defaultCycleSettings(), palpationDays: 21, nestBoxInDays: 20 })).toEqual([
      'palpationDays: Palpate before the nest box goes in',
    ]);
    expect(messages({ ...defaultCycleSettings(), kindlingOverdueDays: 31 })).toEqual(['kindlingOverdueDays: The overdue alert comes after the expected kindling day']);
    expect(messages({ ...defaultCycleSettings(), kindlingWindowEndDays: 30 })).toEqual([
      'kindlingWindowEndDays: The kindling window must close on or after the expected day',
      'kindlingOverdueDays: The overdue alert must fall inside the kindling window',
    ]);
    expect(messages({ ...defaultCycleSettings(), weighInAgesDays: [28, 56, 42] })).toEqual(['weighInAgesDays: List each weigh-in age once, youngest first']);
    expect(messages({ ...defaultCycleSettings(), nestBoxOutDays: 30, weaningDays: 28 })).toEqual(['nestBoxOutDays: Take the nest box out by weaning']);
  });

  it('when an unknown setting is sent, then it is refused', () => {
    expect(cycleSettingsSchema.safeParse({ ...defaultCycleSettings(), gestationDays: 31 }).success).toBe(false);
  });

  it('when a patch changes one setting, then it needs the version and nothing else', () => {
    expect(cycleSettingsPatchSchema.parse({ weaningDays: 35, version: 3 })).toEqual({ weaningDays: 35, version: 3 });
    expect(cycleSettingsPatchSchema.safeParse({ weaningDays: 35 }).success).toBe(false);
    expect(cycleSettingsPatchSchema.safeParse({ weaningDays: 5, version: 3 }).success).toBe(false);
  });

  it('when a farm value is compared with the published range, then outside values are marked, not refused', () => {
    expect(outsidePublishedRange('palpationDays', 9)).toBe('below');
    expect(outsidePublishedRange('weaningDays', 42)).toBe('within');
    expect(outsidePublishedRange('breedBackDays', 56)).toBe('above');
    expect(outsidePublishedRange('targetLiveWeightGrams', 2270)).toBe('within'); // 5 lb = 2,268 g, to 10 g
    expect(outsidePublishedRange('weighInAgesDays', 28)).toBeNull();
  });
});
