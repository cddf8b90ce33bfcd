import { useSession } from './session';

/** Money in the co-op's currency, from integer cents. */
export function useMoney(): (cents: number | null) => string {
  const { coop } = useSession();
  const format = new Intl.NumberFormat('en-US', { style: 'currency', currency: coop.currency || 'USD' });
  return (cents) => (cents === null ? '—' : format.format(cents / 100));
}
