import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import {
  addDays, allocateByHeadDays, feedKeyOf, purchaseFact, useFact, allocateByLiveWeight, checkFeedUses, daysBetween, defineAbilityFor, formatWeight, gompertzWeight, MATURE_WEIGHT_PRIORS, RealtimeEvent, referenceCurve, rooms, subjectOf, feedBookQuerySchema, type FeedBookQuery, type FeedOverviewDto, type FeedPurchaseCreateInput, type FeedPurchaseUpdateInput, type FeedUseCreateInput, type FeedUseUpdateInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { animalFactsOf } from '../animals/animal-facts.service';
import { addMessage, canSeeMoney, ensureCan, farmOf } from '../farms/farm-access';
import { farmTodayOf } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { groupOfFarm, groupsPresentDuring, kitsInGroupsByLitter } from '../grow-out/grow-out-facts.service';
import {
  farmLitterFactsOf, housingUnitOfFarm, placementsDuring, type LitterFacts,
} from '../litters/litter-facts.service';
import { FeedPurchase, FeedUse, FeedUseShare } from './feed.model';
import { presentFeedOverview, type FeedBookLabels, type FeedBookPage, type FeedBookShare } from './feed.presenter';
import { feedLedgerOf, feedTotalsByLitter, refreshFeedBook } from './feed-totals.service';
import { selectPrepared } from '../../db/prepared';
import { lockUntilCommit } from '../../db/advisory-lock';
import { recordChanges } from '../audit/audit.service';

/** Feed given to a doe and her litter from kindling to weaning (doe-level and hutch/pen feed), by litter id. */
export async function doeLitterFeedOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<Map<string, { grams: number; costCents: number }>> {
  return feedTotalsByLitter(tx, coopId, farmId);
}

/** The feed book is farm-private: another farm's is never shown; on one's own farm a refusal is 403. */
function ensureCanFeed(actor: SessionUser, action: 'read' | 'create' | 'update' | 'delete', farmId: string): void {
  ensureCan(actor, action, 'FeedRecord', { farmId }, 'That feed book', action === 'read' ? 'You may not see the feed book' : 'Only members of the farm record feed');
}

/** Weights in refusals read in the farm's units. */
async function farmWeightShown(tx: Transaction, coopId: string, farmId: string): Promise<(grams: number) => string> {
  const unit = (await farmDirectoryOf(coopId, tx)).get(farmId)?.weightUnit ?? 'lb_oz';
  return (grams) => formatWeight(grams, unit);
}

/** After any change to the book: its stored figures worked anew, and the farm's screens told once committed. */
async function bookChanged(tx: Transaction, coopId: string, farmId: string): Promise<void> {
  await refreshFeedBook(tx, coopId, farmId);
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.growOutChanged, { farmId, groupId: null }));
}

async function lockFarm(tx: Transaction, farmId: string): Promise<void> {
  await lockUntilCommit(tx, `feed:${farmId}`);
}

type KitsInGroups = Map<string, { on: string; heads: number }[]>;

/** Kits still with the doe on a day: the litter's count less kits taken into grow-out groups by then. */
function kitsOnDoe(l: LitterFacts, day: string, inGroups: KitsInGroups): number {
  const taken = (inGroups.get(l.id) ?? []).filter((g) => g.on <= day).reduce((n, g) => n + g.heads, 0);
  return Math.max(l.onDoeAt(day) - taken, 0);
}

/** A doe and her litter in a period: heads a day (the doe and the kits with her) and live weight at the end. */
function litterShareBasis(l: LitterFacts, from: string, to: string, inGroups: KitsInGroups): { headDays: number; liveGrams: number } {
  let headDays = 0;
  for (let day = from > l.kindledOn ? from : l.kindledOn; day <= to; day = addDays(day, 1)) {
    const kits = kitsOnDoe(l, day, inGroups);
    if (kits > 0) headDays += 1 + kits;
  }
  // The doe's weight is the medium-breed mature prior (no doe weigh-in is assumed); kits by the reference curve.
  const kitGrams = gompertzWeight(Math.max(daysBetween(l.kindledOn, to), 0), referenceCurve('medium'));
  const liveGrams = headDays > 0 ? MATURE_WEIGHT_PRIORS.medium.grams + kitsOnDoe(l, to, inGroups) * kitGrams : 0;
  return { headDays, liveGrams: Math.round(liveGrams) };
}

const nursingIn = (l: LitterFacts, from: string, to: string, inGroups: KitsInGroups) =>
  l.kindledOn <= to && (l.weanedOn === null || l.weanedOn >= from) && litterShareBasis(l, from, to, inGroups).headDays > 0;

/** The first page, as a change answers with it (the screen goes back to the latest entries). */
const firstPage = feedBookQuerySchema.parse({});

/**
 * A page of the book in one statement and one row: every purchase with its stock left (newest first), the
 * count of the feed given, and the page of it, latest first, with the figures stored beside its rows and
 * what its labels name (the group, pen or doe fed, who entered it, and each share's group or litter and its
 * dam). The page's ids are taken first, so labels are looked up by key for its rows only, however deep the
 * page; as the request's first statement it is planned on each request, so it keeps to plain lookups the
 * planner has no join order to search for.
 */
const feedBookPageSql = `SELECT
    (SELECT count(*)::int FROM feed_uses c WHERE c.coop_id = $1 AND c.farm_id = $2 AND c.deleted_at IS NULL) AS "usesTotal",
    (SELECT coalesce(json_agg(json_build_object(
        'id', p.id, 'boughtOn', p.bought_on, 'productName', p.product_name, 'bagGrams', p.bag_grams, 'bags', p.bags,
        'priceCents', p.price_cents, 'crudeProteinPercent', p.crude_protein_percent, 'note', p.note, 'version', p.version,
        'gramsLeft', p.grams_left
      ) ORDER BY p.bought_on DESC, p.created_at DESC), '[]')
     FROM feed_purchases p WHERE p.coop_id = $1 AND p.farm_id = $2 AND p.deleted_at IS NULL) AS purchases,
    (SELECT coalesce(json_agg(page ORDER BY page.position), '[]') FROM (
      SELECT u.id, u.given_on AS "givenOn", u.from_on AS "fromOn", u.grams, u.feed_key AS "feedKey", u.purchase_id AS "purchaseId",
        u.target, u.group_id AS "groupId", u.housing_unit_id AS "housingUnitId", u.doe_id AS "doeId", u.allocation, u.version,
        u.entered_by AS "enteredBy", u.note, u.cost_cents AS "costCents", shown.position,
        (SELECT g.name FROM grow_out_groups g WHERE g.id = u.group_id AND g.deleted_at IS NULL) AS "groupName",
        (SELECT h.name FROM housing_units h WHERE h.id = u.housing_unit_id) AS "unitName",
        (SELECT d.name FROM animals d WHERE d.id = u.doe_id AND d.deleted_at IS NULL) AS "doeName",
        (SELECT who.name FROM users who WHERE who.id = u.entered_by) AS "enteredByName",
        (SELECT coalesce(json_agg(json_build_object(
            'groupId', s.group_id, 'litterId', s.litter_id, 'grams', s.grams,
            'groupName', (SELECT sg.name FROM grow_out_groups sg WHERE sg.id = s.group_id AND sg.deleted_at IS NULL),
            'litter', (SELECT json_build_object('damId', l.dam_id, 'kindledOn', l.kindled_on,
                'damName', (SELECT dam.name FROM animals dam WHERE dam.id = l.dam_id AND dam.deleted_at IS NULL))
              FROM litters l WHERE l.id = s.litter_id AND l.deleted_at IS NULL)
          ) ORDER BY s.id), '[]')
         FROM feed_use_shares s WHERE s.coop_id = u.coop_id AND s.feed_use_id = u.id) AS shares
      FROM (
        SELECT u.id, row_number() OVER (ORDER BY u.given_on DESC, u.created_at DESC) AS position FROM feed_uses u
        WHERE u.coop_id = $1 AND u.farm_id = $2 AND u.deleted_at IS NULL
        ORDER BY u.given_on DESC, u.created_at DESC LIMIT $3 OFFSET $4
      ) shown JOIN feed_uses u ON u.id = shown.id
    ) page) AS uses`;

type ShareRow = FeedBookShare & { groupName: string | null; litter: { damId: string; kindledOn: string; damName: string | null } | null };
type UseRow = FeedBookPage['uses'][number] & {
  groupName: string | null; unitName: string | null; doeName: string | null; enteredByName: string | null; shares: ShareRow[];
};
type BookRow = { usesTotal: number; purchases: FeedBookPage['purchases']; uses: UseRow[] };

/** A page of the book, latest feed given first, with the labels of what it names (present only what is found). */
async function feedBookPage(tx: Transaction, coopId: string, farmId: string, page: FeedBookQuery): Promise<{ book: FeedBookPage; labels: FeedBookLabels }> {
  const [row] = await selectPrepared<BookRow>(tx, feedBookPageSql, [coopId, farmId, page.pageSize, (page.page - 1) * page.pageSize], { onlyStatement: true });
  const { uses } = row!;
  const labels: FeedBookLabels = { groups: new Map(), litters: new Map(), animals: new Map(), units: new Map(), names: new Map() };
  for (const u of uses) {
    if (u.groupId && u.groupName !== null) labels.groups.set(u.groupId, u.groupName);
    if (u.housingUnitId && u.unitName !== null) labels.units.set(u.housingUnitId, u.unitName);
    if (u.doeId && u.doeName !== null) labels.animals.set(u.doeId, { name: u.doeName });
    if (u.enteredByName !== null) labels.names.set(u.enteredBy, u.enteredByName);
    for (const s of u.shares) {
      if (s.groupId && s.groupName !== null) labels.groups.set(s.groupId, s.groupName);
      if (s.litterId && s.litter) {
        labels.litters.set(s.litterId, { damId: s.litter.damId, kindledOn: s.litter.kindledOn });
        if (s.litter.damName !== null) labels.animals.set(s.litter.damId, { name: s.litter.damName });
      }
    }
  }
  return {
    book: {
      purchases: row!.purchases,
      uses: uses.map((u) => ({
        id: u.id, givenOn: u.givenOn, fromOn: u.fromOn, grams: u.grams, feedKey: u.feedKey, purchaseId: u.purchaseId, target: u.target, groupId: u.groupId,
        housingUnitId: u.housingUnitId, doeId: u.doeId, allocation: u.allocation, version: u.version, enteredBy: u.enteredBy, note: u.note, costCents: u.costCents,
      })),
      usesTotal: row!.usesTotal,
      sharesByUse: new Map(uses.map((u) => [u.id, u.shares.map((s) => ({ groupId: s.groupId, litterId: s.litterId, grams: s.grams }))])),
    },
    labels,
  };
}

async function presentOverview(tx: Transaction, actor: SessionUser, farmId: string, page: FeedBookQuery = firstPage): Promise<FeedOverviewDto> {
  const { book, labels } = await feedBookPage(tx, actor.coopId, farmId, page);
  return presentFeedOverview(book, page, {
    ...labels, canSeeMoney: canSeeMoney(actor, farmId),
    canEdit: defineAbilityFor(actor).can('create', subjectOf('FeedRecord', { coopId: actor.coopId, farmId })),
  });
}

/** The farm's feed book: purchases with the stock left in each, and a page of the feed given with its split (money for members only). */
export async function listFeed(actor: SessionUser, page: FeedBookQuery = firstPage): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'read', farmId);
  return withTenant(actor, async (tx) => presentOverview(tx, actor, farmId, page));
}

/** Records feed bought in whole bags. Refused (400) in the farm's future. */
export async function recordFeedPurchase(actor: SessionUser, input: FeedPurchaseCreateInput): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'create', farmId);
  return withTenant(actor, async (tx) => {
    if (input.id && (await FeedPurchase.findOne({ where: { id: input.id }, paranoid: false, transaction: tx }))) return presentOverview(tx, actor, farmId);
    await recordFeedPurchaseIn(tx, actor, input);
    return presentOverview(tx, actor, farmId);
  });
}

/** A feed purchase inside the caller's transaction (the demo loader); the same checks. */
export async function recordFeedPurchaseIn(tx: Transaction, actor: SessionUser, input: FeedPurchaseCreateInput): Promise<void> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'create', farmId);
  {
    await lockFarm(tx, farmId);
    if (input.boughtOn > (await farmTodayOf(tx, actor.coopId, farmId))) throw AppError.validation({ boughtOn: ['A purchase cannot be dated in the future'] });
    await FeedPurchase.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId, farmId, boughtOn: input.boughtOn, productName: input.productName, bagGrams: input.bagGrams, bags: input.bags,
        priceCents: input.priceCents, crudeProteinPercent: input.crudeProteinPercent ?? null, note: input.note, enteredBy: actor.id,
      },
      { transaction: tx },
    );
    await bookChanged(tx, actor.coopId, farmId);
  }
}

/**
 * Records feed given. Refused (400, nothing written) before the feed was bought, for more than is left
 * (first bought, first used, also for later feed given that a back-dated entry would leave short), in the
 * future, or to a group, pen or doe not of the farm. Feed to a pen or the whole farm is split over the
 * groups and nursing litters present in the period by head-days or by live weight, and the split kept.
 */
export async function recordFeedUse(actor: SessionUser, input: FeedUseCreateInput): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'create', farmId);
  return withTenant(actor, async (tx) => {
    if (input.id && (await FeedUse.findOne({ where: { id: input.id }, paranoid: false, transaction: tx }))) return presentOverview(tx, actor, farmId);
    await recordFeedUseIn(tx, actor, input);
    return presentOverview(tx, actor, farmId);
  });
}

/** Feed given inside the caller's transaction (the demo loader); the same checks. */
export async function recordFeedUseIn(tx: Transaction, actor: SessionUser, input: FeedUseCreateInput): Promise<void> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'create', farmId);
  {
    await lockFarm(tx, farmId);
    const today = await farmTodayOf(tx, actor.coopId, farmId);
    const fromOn = input.fromOn ?? input.givenOn;
    const errors: Record<string, string[]> = {};
    const add = (field: string, message: string) => addMessage(errors, field, message);
    if (input.givenOn > today) add('givenOn', 'Feed given cannot be dated in the future');

    // Which feed: a named purchase, or the feed by name (first bought, first used).
    const ledger = await feedLedgerOf(tx, actor.coopId, farmId);
    const inGroups = await kitsInGroupsByLitter(tx, actor.coopId, farmId);
    let feedKey: string | null = null;
    if (input.purchaseId) {
      const purchase = ledger.purchases.find((p) => p.id === input.purchaseId);
      if (!purchase) add('purchaseId', "Choose one of your farm's purchases");
      else {
        feedKey = feedKeyOf(purchase.productName);
        if (purchase.boughtOn > input.givenOn) add('givenOn', `Feed given on ${input.givenOn}, before that purchase was bought on ${purchase.boughtOn}`);
      }
    } else if (input.productName) {
      feedKey = feedKeyOf(input.productName);
      if (!ledger.purchases.some((p) => feedKeyOf(p.productName) === feedKey)) add('productName', 'No purchase of that feed is recorded: record the purchase first');
    }

    // Who it went to.
    let shares: { groupId: string | null; litterId: string | null; grams: number }[] = [];
    if (input.target === 'group') {
      const group = await groupOfFarm(tx, actor.coopId, farmId, input.groupId!);
      if (!group) add('groupId', "Choose one of your farm's grow-out groups");
      else if (input.givenOn < group.formedOn || (group.closedOn && fromOn > group.closedOn)) add('givenOn', `The group was growing from ${group.formedOn}${group.closedOn ? ` to ${group.closedOn}` : ''}`);
      else shares = [{ groupId: group.id, litterId: null, grams: input.grams }];
    } else if (input.target === 'doe') {
      const doe = (await animalFactsOf(tx, actor.coopId, [input.doeId!])).get(input.doeId!);
      if (!doe || doe.keepingFarmId !== farmId || doe.sex !== 'doe') add('doeId', "Choose one of your farm's does");
      else {
        const litter = (await farmLitterFactsOf(tx, actor.coopId, farmId)).find((l) => l.damId === doe.id && nursingIn(l, fromOn, input.givenOn, inGroups));
        // Between litters the feed is the doe's own (upkeep), not charged to a litter.
        if (litter) shares = [{ groupId: null, litterId: litter.id, grams: input.grams }];
      }
    } else {
      let unitId: string | undefined;
      if (input.target === 'pen') {
        const unit = await housingUnitOfFarm(tx, actor.coopId, farmId, input.housingUnitId!);
        if (!unit) add('housingUnitId', "Choose one of your farm's hutches or pens");
        unitId = unit?.id;
      }
      if (input.target === 'farm' || unitId) {
        const groups = await groupsPresentDuring(tx, actor.coopId, farmId, fromOn, input.givenOn, unitId);
        let litters = (await farmLitterFactsOf(tx, actor.coopId, farmId)).filter((l) => nursingIn(l, fromOn, input.givenOn, inGroups));
        if (unitId) {
          const placed = await placementsDuring(tx, actor.coopId, farmId, fromOn, input.givenOn, unitId);
          const litterIds = new Set(placed.map((p) => p.litterId).filter(Boolean));
          const doeIds = new Set(placed.map((p) => p.animalId).filter(Boolean));
          litters = litters.filter((l) => litterIds.has(l.id) || doeIds.has(l.damId));
        }
        const recipients = [
          ...groups.map((g) => ({ groupId: g.id, litterId: null, headDays: g.headDays, liveGrams: g.liveGrams })),
          ...litters.map((l) => ({ groupId: null, litterId: l.id, ...litterShareBasis(l, fromOn, input.givenOn, inGroups) })),
        ].filter((r) => r.headDays > 0);
        if (recipients.length > 0) {
          const keyed = recipients.map((r, i) => ({ ...r, id: String(i) }));
          const split = input.allocation === 'live_weight' && keyed.some((r) => r.liveGrams > 0)
            ? allocateByLiveWeight(input.grams, keyed)
            : allocateByHeadDays(input.grams, keyed);
          shares = split.map((s) => ({ groupId: keyed[Number(s.id)]!.groupId, litterId: keyed[Number(s.id)]!.litterId, grams: s.grams })).filter((s) => s.grams > 0);
        }
      }
    }

    // Stock: first bought, first used, counting this entry among the others.
    const useId = input.id ?? randomUUID();
    if (feedKey && !errors.givenOn && !errors.purchaseId) {
      const purchases = ledger.purchases.map(purchaseFact);
      const uses = [...ledger.uses.map(useFact), { id: useId, feedId: feedKey, givenOn: input.givenOn, grams: input.grams }];
      // Feed given already short before this entry (rows written around the service) is not its fault.
      const alreadyShort = new Set(checkFeedUses(purchases, ledger.uses.map(useFact)).map((i) => i.useId));
      for (const issue of checkFeedUses(purchases, uses, await farmWeightShown(tx, actor.coopId, farmId))) {
        if (alreadyShort.has(issue.useId)) continue;
        if (issue.useId === useId) add(issue.code === 'before_purchase' ? 'givenOn' : 'grams', issue.message);
        else {
          const other = ledger.uses.find((u) => u.id === issue.useId);
          add('grams', `That would leave the feed given on ${other?.givenOn ?? 'a later day'} short: ${issue.message}`);
        }
      }
    }
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);

    await FeedUse.create(
      {
        id: useId, coopId: actor.coopId, farmId, givenOn: input.givenOn, fromOn, grams: input.grams, feedKey: feedKey!,
        purchaseId: input.purchaseId ?? null, target: input.target, groupId: input.target === 'group' ? input.groupId! : null,
        housingUnitId: input.target === 'pen' ? input.housingUnitId! : null, doeId: input.target === 'doe' ? input.doeId! : null,
        allocation: input.target === 'pen' || input.target === 'farm' ? input.allocation! : null, note: input.note, enteredBy: actor.id,
      },
      { transaction: tx },
    );
    if (shares.length > 0) await FeedUseShare.bulkCreate(shares.map((s) => ({ coopId: actor.coopId, feedUseId: useId, ...s })), { transaction: tx });
    await bookChanged(tx, actor.coopId, farmId);
  }
}

/** The feed given that the book as it now stands cannot cover (before its feed was bought, or more than was left), by entry. */
async function uncoveredFeedGiven(tx: Transaction, coopId: string, farmId: string): Promise<Map<string, string>> {
  const ledger = await feedLedgerOf(tx, coopId, farmId);
  const bought = new Map(ledger.purchases.map((p) => [p.id, p]));
  const problems = new Map<string, string>();
  for (const u of ledger.uses) {
    if (u.purchaseId && (!bought.has(u.purchaseId) || bought.get(u.purchaseId)!.boughtOn > u.givenOn)) problems.set(u.id, `The feed given on ${u.givenOn} was drawn from this purchase`);
  }
  for (const i of checkFeedUses(ledger.purchases.map(purchaseFact), ledger.uses.map(useFact), await farmWeightShown(tx, coopId, farmId))) {
    if (!problems.has(i.useId)) problems.set(i.useId, `That would leave the feed given on ${ledger.useById.get(i.useId)?.givenOn ?? 'a later day'} short: ${i.message}`);
  }
  return problems;
}

/**
 * Makes a change to the purchases and answers what it leaves uncovered that was covered before (feed
 * given that was already short, e.g. rows written around the service, is not this change's fault).
 */
async function uncoveredBy(tx: Transaction, coopId: string, farmId: string, change: () => Promise<unknown>): Promise<string[]> {
  const before = await uncoveredFeedGiven(tx, coopId, farmId);
  await change();
  return [...(await uncoveredFeedGiven(tx, coopId, farmId)).entries()].filter(([useId]) => !before.has(useId)).map(([, message]) => message);
}

async function purchaseToChange(tx: Transaction, actor: SessionUser, farmId: string, purchaseId: string, version: number): Promise<FeedPurchase> {
  await lockFarm(tx, farmId);
  const purchase = await FeedPurchase.findOne({ where: { id: purchaseId, coopId: actor.coopId, farmId }, transaction: tx });
  if (!purchase) throw AppError.notFound('That purchase');
  if (purchase.version !== version) throw AppError.staleVersion();
  return purchase;
}

async function useToChange(tx: Transaction, actor: SessionUser, farmId: string, useId: string, version: number): Promise<FeedUse> {
  await lockFarm(tx, farmId);
  const use = await FeedUse.findOne({ where: { id: useId, coopId: actor.coopId, farmId }, transaction: tx });
  if (!use) throw AppError.notFound('That entry of feed given');
  if (use.version !== version) throw AppError.staleVersion();
  return use;
}

/**
 * Corrects a purchase in place. Refused (400, nothing changed) in the future, or when the book would no
 * longer cover the feed already given (less bought, bought later, or the feed renamed away from it).
 */
export async function correctFeedPurchase(actor: SessionUser, purchaseId: string, input: FeedPurchaseUpdateInput): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'update', farmId);
  return withTenant(actor, async (tx) => {
    const purchase = await purchaseToChange(tx, actor, farmId, purchaseId, input.version);
    if (input.boughtOn > (await farmTodayOf(tx, actor.coopId, farmId))) throw AppError.validation({ boughtOn: ['A purchase cannot be dated in the future'] });
    const { version: _seen, ...fields } = input;
    const corrected = { ...fields, crudeProteinPercent: fields.crudeProteinPercent ?? null };
    // The values corrected away stay in the audit log: a price once entered is not lost.
    const changes = Object.fromEntries(
      (Object.keys(corrected) as (keyof typeof corrected)[]).filter((k) => purchase.get(k) !== corrected[k]).map((k): [string, [unknown, unknown]] => [k, [purchase.get(k), corrected[k]]]),
    );
    const problems = await uncoveredBy(tx, actor.coopId, farmId, () => purchase.update(corrected, { transaction: tx }));
    if (problems.length > 0) throw AppError.validation({ grams: problems });
    if (Object.keys(changes).length > 0) await recordChanges({ coopId: actor.coopId, tableName: 'feed_purchases', recordId: purchase.id, actorUserId: actor.id, changes }, tx);
    await bookChanged(tx, actor.coopId, farmId);
    return presentOverview(tx, actor, farmId);
  });
}

/** Takes a purchase out of the book (kept, marked deleted). Refused (409) while feed given still draws on it. */
export async function removeFeedPurchase(actor: SessionUser, purchaseId: string, version: number): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'delete', farmId);
  return withTenant(actor, async (tx) => {
    const purchase = await purchaseToChange(tx, actor, farmId, purchaseId, version);
    const problems = await uncoveredBy(tx, actor.coopId, farmId, () => purchase.destroy({ transaction: tx }));
    if (problems.length > 0) throw AppError.conflict('Feed given draws on this purchase: correct or remove that feed given first', { purchase: problems });
    await bookChanged(tx, actor.coopId, farmId);
    return presentOverview(tx, actor, farmId);
  });
}

/**
 * Corrects feed given: the old entry is kept, marked deleted, and the corrected one recorded in its place
 * with the same checks as a new one and its split worked anew.
 */
export async function correctFeedUse(actor: SessionUser, useId: string, input: FeedUseUpdateInput): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'update', farmId);
  return withTenant(actor, async (tx) => {
    const use = await useToChange(tx, actor, farmId, useId, input.version);
    await use.destroy({ transaction: tx });
    const { version: _seen, ...entry } = input;
    await recordFeedUseIn(tx, actor, entry);
    return presentOverview(tx, actor, farmId);
  });
}

/** Takes feed given out of the book (kept, marked deleted); its share leaves the groups' and litters' figures. */
export async function removeFeedUse(actor: SessionUser, useId: string, version: number): Promise<FeedOverviewDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps a feed book');
  ensureCanFeed(actor, 'delete', farmId);
  return withTenant(actor, async (tx) => {
    const use = await useToChange(tx, actor, farmId, useId, version);
    await use.destroy({ transaction: tx });
    await bookChanged(tx, actor.coopId, farmId);
    return presentOverview(tx, actor, farmId);
  });
}
