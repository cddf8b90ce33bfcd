import { centsPerKg, type FeedBookQuery, type FeedOverviewDto, type FeedUseDto } from '@burrowline/shared';
import type { AnimalFacts } from '../animals/animal-facts.service';
import type { LitterFacts } from '../litters/litter-facts.service';
import { feedKeyOf, sharesWithCost, type FeedLedger } from './feed-totals.service';

/** What the service loads for the feed book besides the ledger. */
export interface FeedOverviewSources {
  groups: Map<string, string>;
  litters: Map<string, LitterFacts>;
  animals: Map<string, AnimalFacts>;
  units: Map<string, string>;
  names: Map<string, string>;
  canSeeMoney: boolean;
  canEdit: boolean;
}

/** The page of feed given that the book shows, latest first (only these are presented). */
export function usesOnPage(ledger: FeedLedger, page: FeedBookQuery): FeedLedger['uses'] {
  const end = ledger.uses.length - (page.page - 1) * page.pageSize;
  return ledger.uses.slice(Math.max(0, end - page.pageSize), Math.max(0, end)).reverse();
}

/** The feed book: purchases with the stock left, a page of feed given with its split and labels; money only for who may see it. */
export function presentFeedOverview(ledger: FeedLedger, page: FeedBookQuery, loaded: FeedOverviewSources): FeedOverviewDto {
  const { groups, litters, animals, units, names } = loaded;
  const money = loaded.canSeeMoney;
  const productOf = new Map(ledger.purchases.map((p) => [feedKeyOf(p.productName), p.productName]));
  const litterLabel = (id: string) => {
    const l = litters.get(id);
    return l ? `${animals.get(l.damId)?.name ?? 'A doe'} and litter (kindled ${l.kindledOn})` : 'A litter';
  };
  const uses: FeedUseDto[] = usesOnPage(ledger, page).map((u) => ({
    id: u.id, givenOn: u.givenOn, fromOn: u.fromOn, grams: u.grams, productName: productOf.get(u.feedKey) ?? u.feedKey, purchaseId: u.purchaseId,
    target: u.target, groupId: u.groupId, housingUnitId: u.housingUnitId, doeId: u.doeId, allocation: u.allocation, version: u.version,
    targetLabel: u.target === 'group' ? groups.get(u.groupId!) ?? 'A group'
      : u.target === 'pen' ? units.get(u.housingUnitId!) ?? 'A pen'
        : u.target === 'doe' ? `${animals.get(u.doeId!)?.name ?? 'A doe'} with her litter`
          : 'Whole farm',
    shares: sharesWithCost(ledger, u.id).map((s) => ({ groupId: s.groupId, litterId: s.litterId, grams: s.grams, label: s.groupId ? groups.get(s.groupId) ?? 'A group' : litterLabel(s.litterId!) })),
    costCents: money ? ledger.costByUse.get(u.id) ?? null : null,
    enteredBy: { id: u.enteredBy, name: names.get(u.enteredBy) ?? 'Someone' },
    note: u.note,
  }));
  const products = new Map<string, { name: string; gramsLeft: number }>();
  for (const p of ledger.purchases) {
    const key = feedKeyOf(p.productName);
    const entry = products.get(key) ?? { name: p.productName, gramsLeft: 0 };
    entry.gramsLeft += ledger.leftByPurchase.get(p.id) ?? 0;
    products.set(key, entry);
  }
  return {
    purchases: [...ledger.purchases].reverse().map((p) => ({
      id: p.id, boughtOn: p.boughtOn, productName: p.productName, bagGrams: p.bagGrams, bags: p.bags, grams: p.bagGrams * p.bags,
      gramsLeft: ledger.leftByPurchase.get(p.id) ?? 0, crudeProteinPercent: p.crudeProteinPercent,
      priceCents: money ? p.priceCents : null, centsPerKg: money ? centsPerKg(p.priceCents, p.bagGrams * p.bags) : null, note: p.note,
      version: p.version,
    })),
    uses,
    usesTotal: ledger.uses.length,
    usesPage: page.page,
    usesPageSize: page.pageSize,
    products: [...products.values()].sort((a, b) => a.name.localeCompare(b.name)),
    canEdit: loaded.canEdit,
    canSeeMoney: money,
  };
}
