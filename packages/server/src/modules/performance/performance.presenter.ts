import type { PerformanceDto, PerformancePeriodChoice, PerformanceTables } from '@burrowline/shared';

/**
 * The performance tables for the screen. Who may not read money (apprentices) gets no price or cost:
 * the group table's feed cost and cost per weight are null.
 */
export function presentPerformance(
  tables: PerformanceTables,
  ctx: { farmId: string; today: string; periodChoice: PerformancePeriodChoice; showsMoney: boolean },
): PerformanceDto {
  const groups = ctx.showsMoney
    ? tables.groups
    : tables.groups.map((g) => ({ ...g, feedCostCents: null, costPerKgLive: null, costPerLbLive: null, costPerKgCarcass: null, costPerLbCarcass: null }));
  return { ...tables, groups, farmId: ctx.farmId, today: ctx.today, periodChoice: ctx.periodChoice, showsMoney: ctx.showsMoney };
}
