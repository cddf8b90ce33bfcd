import type { PerformancePeriodChoice } from '@burrowline/shared';

export type PerformanceFilters = { period: PerformancePeriodChoice; from?: string; to?: string };

export const performanceKeys = {
  all: ['performance'] as const,
  tables: (filters: PerformanceFilters) => ['performance', 'tables', filters] as const,
};
