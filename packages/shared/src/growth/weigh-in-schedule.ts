import { addDays, daysBetween } from '../herd/herd-dates';

export type ScheduledWeighInState = 'weighed' | 'due' | 'upcoming' | 'missed';

export interface ScheduledWeighIn {
  ageDays: number;
  on: string;
  state: ScheduledWeighInState;
  /** The weighing that counted for it (the nearest within the reach). */
  weighedOn: string | null;
}

/** A weighing counts for the farm's age it is nearest, within a week either side (half the usual two weeks between ages). */
export const WEIGH_IN_REACH_DAYS = 7;

/**
 * The farm's weigh-in ages over a group's life (from its kits' birth date, from a week before it was
 * formed until it closed): each one weighed (a weighing within a week of it), due (within a week of
 * today), upcoming, or missed (past, or the group closed without it).
 */
export function weighInSchedule(input: {
  birthDate: string;
  agesDays: ReadonlyArray<number>;
  formedOn: string;
  closedOn: string | null;
  weighedOn: ReadonlyArray<string>;
  today: string;
}): ScheduledWeighIn[] {
  return input.agesDays
    .map((ageDays) => ({ ageDays, on: addDays(input.birthDate, ageDays) }))
    .filter((a) => a.on >= addDays(input.formedOn, -WEIGH_IN_REACH_DAYS) && (input.closedOn === null || a.on <= input.closedOn))
    .map((a) => {
      const near = input.weighedOn
        .filter((d) => Math.abs(daysBetween(a.on, d)) <= WEIGH_IN_REACH_DAYS)
        .sort((x, y) => Math.abs(daysBetween(a.on, x)) - Math.abs(daysBetween(a.on, y)))[0];
      if (near) return { ...a, state: 'weighed' as const, weighedOn: near };
      const fromToday = daysBetween(input.today, a.on);
      const state: ScheduledWeighInState = input.closedOn !== null || fromToday < -WEIGH_IN_REACH_DAYS ? 'missed' : fromToday > WEIGH_IN_REACH_DAYS ? 'upcoming' : 'due';
      return { ...a, state, weighedOn: null };
    });
}
