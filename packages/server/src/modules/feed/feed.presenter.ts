import { centsPerKg, type FeedBookQuery, type FeedOverviewDto, type FeedUseDto } from '@burrowline/shared';
import { feedKeyOf } from '@burrowline/shared';
import type { FeedPurchase, FeedUse } from './feed.model';

/** A share of feed given: to a grow-out group or a nursing litter. */
export interface FeedBookShare { groupId: string | null; litterId: string | null; grams: number }

/** One page of a farm's feed book as read, with the figures stored beside its rows. */
export interface FeedBookPage {
  /** Every purchase, newest first, with its stock left. */
  purchases: Pick<FeedPurchase, 'id' | 'boughtOn' | 'productName' | 'bagGrams' | 'bags' | 'priceCents' | 'crudeProteinPercent' | 'note' | 'version' | 'gramsLeft'>[];
  /** The page's feed given, latest first, each with its cost (null when the book cannot cover it). */
  uses: (Pick<FeedUse, 'id' | 'givenOn' | 'fromOn' | 'grams' | 'feedKey' | 'purchaseId' | 'target' | 'groupId' | 'housingUnitId' | 'doeId' | 'allocation' | 'version' | 'enteredBy' | 'note'> & { costCents: number | null })[];
  usesTotal: number;
  sharesByUse: Map<string, FeedBookShare[]>;
}

/** What the page's labels name, by id: only what was found (the rest reads "A group", "A doe"…). */
export interface FeedBookLabels {
  groups: Map<string, string>;
  litters: Map<string, { damId: string; kindledOn: string }>;
  animals: Map<string, { name: string }>;
  units: Map<string, string>;
  names: Map<string, string>;
}

/** What the service loads for the feed book besides its page. */
export interface FeedOverviewSources extends FeedBookLabels {
  canSeeMoney: boolean;
  canEdit: boolean;
}

/** The feed book: purchases with the stock left, a page of feed given with its split and labels; money only for who may see it. */
export function presentFeedOverview(book: FeedBookPage, page: FeedBookQuery, loaded: FeedOverviewSources): FeedOverviewDto {
  const { groups, litters, animals, units, names } = loaded;
  const money = loaded.canSeeMoney;
  const productOf = new Map(book.purchases.map((p) => [feedKeyOf(p.productName), p.productName]));
  const litterLabel = (id: string) => {
    const l = litters.get(id);
    return l ? `${animals.get(l.damId)?.name ?? 'A doe'} and litter (kindled ${l.kindledOn})` : 'A litter';
  };
  const uses: FeedUseDto[] = book.uses.map((u) => ({
    id: u.id, givenOn: u.givenOn, fromOn: u.fromOn, grams: u.grams, productName: productOf.get(u.feedKey) ?? u.feedKey, purchaseId: u.purchaseId,
    target: u.target, groupId: u.groupId, housingUnitId: u.housingUnitId, doeId: u.doeId, allocation: u.allocation, version: u.version,
    targetLabel: u.target === 'group' ? groups.get(u.groupId!) ?? 'A group'
      : u.target === 'pen' ? units.get(u.housingUnitId!) ?? 'A pen'
        : u.target === 'doe' ? `${animals.get(u.doeId!)?.name ?? 'A doe'} with her litter`
          : 'Whole farm',
    shares: (book.sharesByUse.get(u.id) ?? []).map((s) => ({ groupId: s.groupId, litterId: s.litterId, grams: s.grams, label: s.groupId ? groups.get(s.groupId) ?? 'A group' : litterLabel(s.litterId!) })),
    costCents: money ? u.costCents : null,
    enteredBy: { id: u.enteredBy, name: names.get(u.enteredBy) ?? 'Someone' },
    note: u.note,
  }));
  const products = new Map<string, { name: string; gramsLeft: number }>();
  // Oldest first, as the book reads: a product keeps the name it was first bought under.
  for (const p of [...book.purchases].reverse()) {
    const key = feedKeyOf(p.productName);
    const entry = products.get(key) ?? { name: p.productName, gramsLeft: 0 };
    entry.gramsLeft += p.gramsLeft ?? 0;
    products.set(key, entry);
  }
  return {
    purchases: book.purchases.map((p) => ({
      id: p.id, boughtOn: p.boughtOn, productName: p.productName, bagGrams: p.bagGrams, bags: p.bags, grams: p.bagGrams * p.bags,
      gramsLeft: p.gramsLeft ?? 0, crudeProteinPercent: p.crudeProteinPercent,
      priceCents: money ? p.priceCents : null, centsPerKg: money ? centsPerKg(p.priceCents, p.bagGrams * p.bags) : null, note: p.note,
      version: p.version,
    })),
    uses,
    usesTotal: book.usesTotal,
    usesPage: page.page,
    usesPageSize: page.pageSize,
    products: [...products.values()].sort((a, b) => a.name.localeCompare(b.name)),
    canEdit: loaded.canEdit,
    canSeeMoney: money,
  };
}
