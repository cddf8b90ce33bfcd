import type { TransferKind } from '@burrowline/shared';

export const kindLabels: Record<TransferKind, string> = {
  stud_fee: 'Stud fee', processing_fee: 'Processing fee', shared_cost: 'Shared cost', sale: 'Sale', dues: 'Dues',
  payment: 'Payment', settlement: 'Settlement', correction: 'Correction',
};

/** Chart colours per kind: the brand palette first, then greys. */
export const kindColours: Record<string, string> = {
  stud_fee: '#2F5D50', processing_fee: '#E9C46A', shared_cost: '#B5532F', sale: '#6B8F71', dues: '#8A7F76',
};

export function monthLabel(month: string): string {
  const [y, m] = month.split('-').map(Number) as [number, number];
  return new Date(Date.UTC(y, m - 1, 1)).toLocaleDateString('en-US', { month: 'short', timeZone: 'UTC' });
}
