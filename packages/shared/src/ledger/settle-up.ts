/**
 * Settling up: from each farm's net position with the other farms (positive: owed to it), a short list
 * of payments that clears every position. Greedy: the largest debtor pays the largest creditor as much as
 * both allow; each payment clears at least one of them, so n farms with a non-zero position need at most
 * n − 1 payments. (A shortest list is NP-hard in general; the greedy list is the usual practice.)
 */
export interface NetPosition {
  farmId: string;
  /** Integer cents; the positions sum to zero. */
  netCents: number;
}

export interface SuggestedPayment {
  fromFarmId: string;
  toFarmId: string;
  amountCents: number;
}

export function settleUp(positions: readonly NetPosition[]): SuggestedPayment[] {
  const total = positions.reduce((sum, p) => sum + p.netCents, 0);
  if (total !== 0) throw new Error(`positions must sum to zero, got ${total}`);
  // Ties broken by id so the same books always give the same list.
  const byAmount = (a: { cents: number; farmId: string }, b: { cents: number; farmId: string }) => b.cents - a.cents || a.farmId.localeCompare(b.farmId);
  const creditors = positions.filter((p) => p.netCents > 0).map((p) => ({ farmId: p.farmId, cents: p.netCents }));
  const debtors = positions.filter((p) => p.netCents < 0).map((p) => ({ farmId: p.farmId, cents: -p.netCents }));
  const payments: SuggestedPayment[] = [];
  while (creditors.length > 0 && debtors.length > 0) {
    creditors.sort(byAmount);
    debtors.sort(byAmount);
    const creditor = creditors[0]!;
    const debtor = debtors[0]!;
    const amount = Math.min(creditor.cents, debtor.cents);
    payments.push({ fromFarmId: debtor.farmId, toFarmId: creditor.farmId, amountCents: amount });
    creditor.cents -= amount;
    debtor.cents -= amount;
    if (creditor.cents === 0) creditors.shift();
    if (debtor.cents === 0) debtors.shift();
  }
  return payments;
}
