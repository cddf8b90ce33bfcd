import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import type { CycleSettings, PerformanceGroupInput, PerformancePeriod, PerformanceProcessingInput } from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';
import { groupBy } from '../../lib/group-by';
import { serviceOutcomeFactsOf, type ServiceOutcomeFacts } from '../almanac/breeding.service';
import { litterPerformanceFactsOf, type LitterPerformanceFacts } from '../litters/litters.service';

/**
 * The farm's records the performance tables read — services, litters and their events, grow-out groups
 * with their litters and accepted weigh-ins, the feed book's stored shares, processing — in one
 * statement that answers each table as one packed text (see `packed`). It reads what each module's
 * published facts read (`serviceOutcomesOfFarm`, `litterFactsOfFarm`, `growOutFactsOfFarm`,
 * `feedTotalsOfFarm`, `processingFactsOfFarm`), with the same filters and order, over a period only the part
 * its tables can name; `test/api/performance-kept.test.ts` holds the tables to the same answer. The outcome of a service and a
 * litter's record are still worked out by their modules' own functions.
 */
export interface PerformanceSources {
  services: ServiceOutcomeFacts[];
  litters: LitterPerformanceFacts[];
  groups: PerformanceGroupInput[];
  doeLitterFeed: Map<string, { grams: number; costCents: number }>;
  processing: PerformanceProcessingInput[];
}

/** Each table packed as text (see `packed`): one string a table. */
type SourceRows = Record<'services' | 'litters' | 'events' | 'feed' | 'groups' | 'members' | 'member_litters' | 'weigh_ins' | 'processing', string>;

/**
 * A table's rows packed into one text: the fields of a row joined by U+001F, the rows by U+001E, a text
 * field written as a JSON string (JSON escapes both separators), SQL NULL as an empty field. Building this
 * costs PostgreSQL about half of a JSON array a row (no per-value type look-up), and it is unpacked with
 * two splits.
 */
const packed = (fields: string[], from: string, orderBy?: string) =>
  `(SELECT coalesce(string_agg(concat_ws(chr(31), ${fields.map((f) => `coalesce((${f})::text, '')`).join(', ')}), chr(30)${orderBy ? ` ORDER BY ${orderBy}` : ''}), '') ${from})`;

const unpack = (text: string): string[][] => (text === '' ? [] : text.split('\u001e').map((row) => row.split('\u001f')));

// Each table's rows are positional (smaller than named fields); the mapping below names them. The groups'
// litters, weigh-ins and feed shares are looked up by the ids of the farm's groups and feed entries
// (`= ANY (ARRAY(...))`, one index scan each, as an IN list would), never joined row by row: a nested loop
// over a misestimated outer side (fresh rows, old statistics) would read them once per group.
//
// Over a period ($3 to $4) only what its tables can name is read: of the grow-out groups those formed in
// it, processed in it, or grown from a litter kindled in it (with all their weigh-ins and processing, which
// their figures rest on); processing records of single animals in it; feed of those groups and of the
// litters kindled in it. Services, litters and their entries are read whole: a doe's figures look back
// past the period's start (her first record, the litter before, the services missed in a row).
function sourcesSql(overPeriod: boolean): string {
  const farmGroups = overPeriod
    ? `AND (g.formed_on BETWEEN $3 AND $4
        OR g.id IN (SELECT p.group_id FROM processing_records p WHERE p.coop_id = $1 AND p.farm_id = $2 AND p.deleted_at IS NULL
                    AND p.group_id IS NOT NULL AND p.processed_on BETWEEN $3 AND $4)
        OR g.id IN (SELECT m.group_id FROM grow_out_group_litters m WHERE m.litter_id = ANY (ARRAY(SELECT id FROM period_litters))))`
    : '';
  const periodLitters = overPeriod
    ? `period_litters AS MATERIALIZED (
    SELECT l.id FROM litters l WHERE l.coop_id = $1 AND l.farm_id = $2 AND l.deleted_at IS NULL AND l.kindled_on BETWEEN $3 AND $4),
  `
    : '';
  const feedShares = overPeriod
    ? `FROM feed_use_shares sh JOIN feed_uses u ON u.id = sh.feed_use_id
      WHERE sh.coop_id = $1 AND u.coop_id = $1 AND u.farm_id = $2 AND u.deleted_at IS NULL
        AND (sh.group_id = ANY (ARRAY(SELECT id FROM farm_groups)) OR sh.litter_id = ANY (ARRAY(SELECT id FROM period_litters)))`
    : `FROM feed_use_shares sh
      WHERE sh.coop_id = $1 AND sh.feed_use_id = ANY (ARRAY(
        SELECT u.id FROM feed_uses u WHERE u.coop_id = $1 AND u.farm_id = $2 AND u.deleted_at IS NULL))`;
  const processing = overPeriod ? 'AND (p.processed_on BETWEEN $3 AND $4 OR p.group_id = ANY (ARRAY(SELECT id FROM farm_groups)))' : '';
  return `WITH ${periodLitters}farm_groups AS MATERIALIZED (
    SELECT g.id, g.name, g.formed_on, g.status, g.closed_on, g.target_grams, g.created_at FROM grow_out_groups g
    WHERE g.coop_id = $1 AND g.farm_id = $2 AND g.deleted_at IS NULL ${farmGroups}),
  members AS MATERIALIZED (
    SELECT m.group_id, m.litter_id, m.heads FROM grow_out_group_litters m WHERE m.group_id = ANY (ARRAY(SELECT id FROM farm_groups)))
  SELECT
  ${packed(['s.id', 's.doe_id', 's.buck_id', 's.serviced_on', 's.status', 's.closed_on', 's.litter_id'],
    'FROM services s WHERE s.coop_id = $1 AND s.farm_id = $2 AND s.deleted_at IS NULL', 's.serviced_on, s.created_at')} AS services,
  ${packed(['l.id', 'l.service_id', 'l.dam_id', 'l.sire_id', 'l.kindled_on', 'l.born_alive', 'l.born_dead'],
    'FROM litters l WHERE l.coop_id = $1 AND l.farm_id = $2 AND l.deleted_at IS NULL', 'l.kindled_on, l.created_at')} AS litters,
  ${packed(['e.id', 'e.litter_id', 'e.kind', 'e.occurred_on', 'e.kit_count', 'to_json(e.cause)', 'e.other_litter_id', 'e.review_state', 'e.weaning_weight_grams'],
    'FROM litter_events e WHERE e.coop_id = $1 AND e.farm_id = $2 AND e.deleted_at IS NULL', 'e.occurred_on, e.created_at')} AS events,
  ${packed(['f.group_id', 'f.litter_id', 'f.grams', 'f.cost_cents'], `FROM (
      SELECT sh.group_id, sh.litter_id, sum(sh.grams) AS grams, coalesce(sum(sh.cost_cents), 0) AS cost_cents
      ${feedShares}
      GROUP BY sh.group_id, sh.litter_id) f`)} AS feed,
  ${packed(['g.id', 'to_json(g.name)', 'g.formed_on', 'g.status', 'g.closed_on', 'g.target_grams'], 'FROM farm_groups g', 'g.formed_on, g.created_at')} AS groups,
  ${packed(['m.group_id', 'm.litter_id', 'm.heads'], 'FROM members m')} AS members,
  ${packed(['l.id', 'l.kindled_on'], 'FROM litters l WHERE l.id = ANY (ARRAY(SELECT litter_id FROM members)) AND l.coop_id = $1 AND l.deleted_at IS NULL')} AS member_litters,
  ${packed(['w.group_id', 'w.weighed_on', 'w.total_grams', 'w.head_count'],
    `FROM weigh_ins w WHERE w.group_id = ANY (ARRAY(SELECT id FROM farm_groups)) AND w.coop_id = $1
      AND w.review_state = 'accepted' AND w.deleted_at IS NULL`, 'w.weighed_on, w.created_at')} AS weigh_ins,
  ${packed(['p.id', 'p.processed_on', 'p.animal_id', 'p.group_id', 'p.head_count', 'p.live_grams', 'p.hot_carcass_grams'],
    `FROM processing_records p WHERE p.coop_id = $1 AND p.farm_id = $2 AND p.deleted_at IS NULL ${processing}`, 'p.processed_on, p.created_at')} AS processing`;
}
const allRecordsSql = sourcesSql(false);
const periodSql = sourcesSql(true);

const str = (v: string | undefined) => v!;
const optStr = (v: string | undefined) => (v ? v : null);
const num = (v: string | undefined) => Number(v);
const text = (v: string | undefined) => (v ? (JSON.parse(v) as string) : null);

/**
 * What was last unpacked for a farm and kind of period, by a digest of the packed text it came from. After
 * a change (most often to one table) a part whose text is the same is not unpacked again and keeps its
 * objects, so what `performanceTables` keeps by object (a litter's summary) is reused too. Least recently
 * used farms are dropped beyond the bound.
 */
const lastUnpacked = new Map<string, Map<string, { digest: string; value: unknown }>>();
const UNPACKED_FARMS = 16;

function unpackedFor(key: string): Map<string, { digest: string; value: unknown }> {
  const parts = lastUnpacked.get(key) ?? new Map<string, { digest: string; value: unknown }>();
  lastUnpacked.delete(key);
  lastUnpacked.set(key, parts);
  while (lastUnpacked.size > UNPACKED_FARMS) lastUnpacked.delete(lastUnpacked.keys().next().value!);
  return parts;
}

function reused<T>(parts: Map<string, { digest: string; value: unknown }>, part: string, texts: string[], make: () => T): T {
  const hash = createHash('sha1');
  for (const t of texts) hash.update(t).update('\u0000');
  const digest = hash.digest('base64');
  const last = parts.get(part);
  if (last?.digest === digest) return last.value as T;
  const value = make();
  parts.set(part, { digest, value });
  return value;
}

/** The farm's records for its tables over `period` (null: every record). */
export async function performanceSourcesOf(
  tx: Transaction, coopId: string, farmId: string, clock: { today: string; settings: CycleSettings; period: PerformancePeriod | null },
): Promise<PerformanceSources> {
  const { period } = clock;
  const [rows] = period
    ? await selectPrepared<SourceRows>(tx, periodSql, [coopId, farmId, period.from, period.to])
    : await selectPrepared<SourceRows>(tx, allRecordsSql, [coopId, farmId]);
  const t = rows!;
  const parts = unpackedFor(`${coopId}|${farmId}|${period ? 'period' : 'all'}`);
  const services = reused(parts, 'services', [t.services, clock.today, JSON.stringify(clock.settings)], () => serviceOutcomeFactsOf(
    unpack(t.services).map((s) => ({
      id: str(s[0]), doeId: str(s[1]), buckId: str(s[2]), servicedOn: str(s[3]), status: str(s[4]) as ServiceOutcomeFacts['status'],
      closedOn: optStr(s[5]), litterId: optStr(s[6]),
    })),
    clock.today, clock.settings,
  ));
  const litters = reused(parts, 'litters', [t.litters, t.events], () => litterPerformanceFactsOf(
    unpack(t.litters).map((l) => ({
      id: str(l[0]), farmId, serviceId: str(l[1]), damId: str(l[2]), sireId: str(l[3]), kindledOn: str(l[4]), bornAlive: num(l[5]), bornDead: num(l[6]),
    })),
    unpack(t.events).map((e) => ({
      id: str(e[0]), litterId: str(e[1]), kind: str(e[2]) as never, occurredOn: str(e[3]), kitCount: num(e[4]), cause: text(e[5]),
      otherLitterId: optStr(e[6]), reviewState: str(e[7]) as never, weaningWeightGrams: e[8] ? num(e[8]) : null,
    })),
  ));
  // The feed book's stored shares, added up per group and per nursing litter.
  const feed = reused(parts, 'feed', [t.feed], () => {
    const byGroup = new Map<string, { grams: number; costCents: number }>();
    const byLitter = new Map<string, { grams: number; costCents: number }>();
    for (const [groupId, litterId, grams, costCents] of unpack(t.feed)) {
      const total = { grams: num(grams), costCents: num(costCents) };
      if (groupId) byGroup.set(groupId, total);
      else if (litterId) byLitter.set(litterId, total);
    }
    return { byGroup, byLitter };
  });
  const groups = reused(parts, 'groups', [t.groups, t.members, t.member_litters, t.weigh_ins, t.feed], (): PerformanceGroupInput[] => {
    // A group's litters with their kindling (a removed litter is left out of its group).
    const kindledOn = new Map(unpack(t.member_litters).map(([id, on]) => [str(id), str(on)]));
    const members = groupBy(unpack(t.members).filter((m) => kindledOn.has(str(m[1]))), (m) => str(m[0]));
    const weighIns = groupBy(unpack(t.weigh_ins), (w) => str(w[0]));
    return unpack(t.groups).map(([id, name, formedOn, status, closedOn, targetGrams]) => ({
      id: str(id), name: text(name)!, formedOn: str(formedOn), status: str(status) as PerformanceGroupInput['status'], closedOn: optStr(closedOn),
      targetGrams: num(targetGrams),
      litters: (members.get(str(id)) ?? []).map((m) => ({ litterId: str(m[1]), heads: num(m[2]), kindledOn: kindledOn.get(str(m[1]))! })),
      weighIns: (weighIns.get(str(id)) ?? []).map((w) => ({ weighedOn: str(w[1]), totalGrams: num(w[2]), headCount: num(w[3]) })),
      feedGrams: feed.byGroup.get(str(id))?.grams ?? 0,
      feedCostCents: feed.byGroup.get(str(id))?.costCents ?? 0,
    }));
  });
  const processing = reused(parts, 'processing', [t.processing], (): PerformanceProcessingInput[] => unpack(t.processing).map((p) => ({
    id: str(p[0]), processedOn: str(p[1]), animalId: optStr(p[2]), groupId: optStr(p[3]), headCount: num(p[4]),
    liveGrams: num(p[5]), hotCarcassGrams: num(p[6]),
  })));
  return { services, litters, groups, doeLitterFeed: feed.byLitter, processing };
}
