import { describe, expect, it } from 'vitest';
import { feedUseCreateSchema } from '../schemas/feed.schema';
import { groupWeighInCreateSchema, growOutGroupCreateSchema } from '../schemas/grow-out.schema';
import { GRAMS_PER_POUND } from '../units/units';
import { DEFAULT_TARGET_GRAMS, projectionModelName, readinessWords } from './grow-out-dto';

describe('grow-out words and defaults', () => {
  it('when no target is set, then it is 2,270 g, about 5 lb (common practice; OSU Ext. Bulletin 745: 4–5 lb at 8 weeks)', () => {
    expect(DEFAULT_TARGET_GRAMS / GRAMS_PER_POUND).toBeCloseTo(5, 1);
  });

  it('when a group is ready, likely, possible or not by a date, then it reads so in words', () => {
    expect(['reached', 'ready', 'likely', 'possible', 'not_ready', 'unknown'].map((r) => readinessWords(r as never))).toEqual([
      'At target already', 'Ready by then', 'Likely ready', 'Possibly ready', 'Not ready by then', 'No projection yet',
    ]);
  });

  it('when the model is a fitted curve or a two-point line, then the screen names it and says why', () => {
    expect(projectionModelName({ status: 'projected', model: { kind: 'gompertz', description: '', weighInDays: 4 } }).name).toBe('Fitted Gompertz growth curve');
    expect(projectionModelName({ status: 'projected', model: { kind: 'gompertz', description: '', weighInDays: 4 } }).why).toContain('4 weigh-in days');
    expect(projectionModelName({ status: 'projected', model: { kind: 'linear_two_point', description: '', weighInDays: 2 } }).name).toBe('Straight line through two weigh-ins');
    expect(projectionModelName({ status: 'too_few_weigh_ins', model: { kind: 'none', description: '', weighInDays: 1 } }).name).toBe('No projection');
  });
});

describe('grow-out and feed inputs', () => {
  it('when a weigh-in gives both a total and single kits, or neither, then it is refused with the field named', () => {
    const both = groupWeighInCreateSchema.safeParse({ weighedOn: '2026-05-01', totalGrams: 3000, headCount: 2, kits: [{ grams: 1500 }] });
    expect(both.success).toBe(false);
    expect(both.error!.issues[0]!.path).toEqual(['totalGrams']);
    const neither = groupWeighInCreateSchema.safeParse({ weighedOn: '2026-05-01' });
    expect(neither.error!.issues.map((i) => i.path[0])).toEqual(['totalGrams', 'headCount']);
    const twins = groupWeighInCreateSchema.safeParse({ weighedOn: '2026-05-01', kits: [{ label: 'L1', grams: 1500 }, { label: 'l1', grams: 1400 }] });
    expect(twins.error!.issues[0]!.message).toBe('Two kits carry the same label');
  });

  it('when a group has no litter or zero heads, then it is refused', () => {
    expect(growOutGroupCreateSchema.safeParse({ name: 'A', formedOn: '2026-05-01', targetGrams: 2270, litters: [] }).success).toBe(false);
    expect(growOutGroupCreateSchema.safeParse({ name: 'A', formedOn: '2026-05-01', targetGrams: 2270, litters: [{ litterId: crypto.randomUUID(), heads: 0 }] }).success).toBe(false);
  });

  it('when feed goes to the whole farm without a rule, or to a pen without the pen, then it is refused', () => {
    const farm = feedUseCreateSchema.safeParse({ givenOn: '2026-05-01', grams: 1000, productName: 'Grower', target: 'farm' });
    expect(farm.error!.issues[0]!.path).toEqual(['allocation']);
    const pen = feedUseCreateSchema.safeParse({ givenOn: '2026-05-01', grams: 1000, productName: 'Grower', target: 'pen', allocation: 'head_days' });
    expect(pen.error!.issues[0]!.path).toEqual(['housingUnitId']);
    expect(feedUseCreateSchema.safeParse({ givenOn: '2026-05-01', grams: -1, productName: 'Grower', target: 'farm', allocation: 'live_weight' }).success).toBe(false);
  });
});
