import {
  breedingRecordFigures, compareByDue, daysBetween, defaultCycleSettings, doeCycleState, doeCycleStates, type BreedingRecordDto,
  type CycleSettings, type DoeBoardDto, type DoeBoardItemDto, type DoeBoardQuery, type DoeCycleFacts, type DoeCycleState, type KitDeathCause,
} from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { animalFactsOf } from '../animals/animal-facts.service';
import { authorize, ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';

/*
 * The doe board and a doe's breeding record. Where a doe stands is the shared doeCycleState (so the screen
 * and the herd list agree); this file only reads her facts, one row per doe, in one statement.
 */

interface DoeFactsRow {
  id: string;
  name: string;
  tattoo: string | null;
  hutch: string;
  birth_date: string | null;
  first_breeding_days: number | null;
  service_id: string | null;
  serviced_on: string | null;
  service_status: 'open' | 'kindled' | 'empty' | 'missed' | null;
  closed_on: string | null;
  palpated_on: string | null;
  palpation_result: 'positive' | 'negative' | null;
  litter_id: string | null;
  kindled_on: string | null;
  born_alive: number | null;
  kits_in: number | null;
  kits_out: number | null;
  weaned: number | null;
  weaned_on: string | null;
  settings: Partial<CycleSettings> | null;
}

/**
 * What her state is read from, for doe `a` on farm `farm` (an SQL parameter): her latest service of this farm
 * and its latest palpation, her latest litter of this farm with the kits that went in and out (returned
 * entries do not count, as on the litter's page). The farm's settings ride along so they cost no statement
 * of their own. `factsColumns` reads what `factsJoins` (after `FROM animals a`) joins.
 */
const factsColumns = (farm: string) => `a.birth_date::text AS birth_date, br.doe_first_breeding_min_days AS first_breeding_days,
    sv.id AS service_id, sv.serviced_on::text AS serviced_on, sv.status AS service_status, sv.closed_on::text AS closed_on,
    pl.palpated_on::text AS palpated_on, pl.result AS palpation_result,
    lt.id AS litter_id, lt.kindled_on::text AS kindled_on, lt.born_alive,
    ev.kits_in, ev.kits_out, ev.weaned, ev.weaned_on::text AS weaned_on,
    (SELECT s.settings FROM farm_cycle_settings s WHERE s.farm_id = ${farm}) AS settings`;
const factsJoins = (farm: string) => `
  LEFT JOIN breeds br ON br.id = a.breed_id
  LEFT JOIN LATERAL (
    SELECT s.id, s.serviced_on, s.status, s.closed_on FROM services s
    WHERE s.doe_id = a.id AND s.farm_id = ${farm} AND s.deleted_at IS NULL ORDER BY s.serviced_on DESC, s.created_at DESC LIMIT 1
  ) sv ON true
  LEFT JOIN LATERAL (
    SELECT p.palpated_on, p.result FROM palpations p WHERE p.service_id = sv.id AND p.review_state = 'accepted' AND p.result <> 'unsure' ORDER BY p.palpated_on DESC, p.created_at DESC LIMIT 1
  ) pl ON true
  LEFT JOIN LATERAL (
    SELECT l.id, l.kindled_on, l.born_alive FROM litters l
    WHERE l.dam_id = a.id AND l.farm_id = ${farm} AND l.deleted_at IS NULL ORDER BY l.kindled_on DESC, l.created_at DESC LIMIT 1
  ) lt ON true
  LEFT JOIN LATERAL (
    SELECT COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'fostered_in'), 0)::int AS kits_in,
      COALESCE(sum(e.kit_count) FILTER (WHERE e.kind IN ('fostered_out', 'lost', 'culled', 'weaned')), 0)::int AS kits_out,
      COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'weaned'), 0)::int AS weaned,
      max(e.occurred_on) FILTER (WHERE e.kind = 'weaned') AS weaned_on
    FROM litter_events e WHERE e.litter_id = lt.id AND e.deleted_at IS NULL AND e.review_state <> 'returned'
  ) ev ON true`;

/** The does a farm keeps and tracks through the cycle: junior or breeding, on the farm. */
const trackedDoe = (farm: string) => `a.keeping_farm_id = ${farm} AND a.sex = 'doe' AND a.disposition = 'on_farm' AND a.deleted_at IS NULL
    AND NOT a.is_outside AND a.lifecycle IN ('junior', 'breeding')`;

/** Each doe the farm keeps, with her facts, in one statement. `$1` the co-op, `$2` the farm. */
const doeFactsSql = `
  SELECT a.id, a.name, a.tattoo, a.hutch, ${factsColumns('$2')}
  FROM animals a ${factsJoins('$2')}
  WHERE a.coop_id = $1 AND ${trackedDoe('$2')}`;

/**
 * The facts of animal `a` as one json value when it is a doe the farm `farm` (an SQL parameter) tracks, else
 * null: a column for another module's list of animals (the herd list's "in her cycle"), read with `doeCycleOfFacts`.
 */
export function doeCycleFactsColumn(farm: string): string {
  return `(CASE WHEN ${trackedDoe(farm)} THEN (SELECT to_json(f) FROM (SELECT ${factsColumns(farm)} FROM (SELECT 1) one ${factsJoins(farm)}) f) END)`;
}

/** Where a doe stands today, from what `doeCycleFactsColumn` read. */
export function doeCycleOfFacts(facts: unknown, today: string): DoeCycleState {
  const row = facts as DoeFactsRow;
  return doeCycleState(factsOf(row), today, settingsOfRow(row));
}

function factsOf(row: DoeFactsRow): DoeCycleFacts {
  const onDoe = Math.max(0, (row.born_alive ?? 0) + (row.kits_in ?? 0) - (row.kits_out ?? 0));
  return {
    birthDate: row.birth_date,
    firstBreedingDays: row.first_breeding_days,
    service: row.serviced_on && row.service_status ? {
      servicedOn: row.serviced_on, status: row.service_status, closedOn: row.closed_on,
      palpation: row.palpated_on && row.palpation_result ? { palpatedOn: row.palpated_on, result: row.palpation_result } : null,
    } : null,
    litter: row.kindled_on ? { kindledOn: row.kindled_on, onDoe, weanedOn: onDoe === 0 && (row.weaned ?? 0) > 0 ? row.weaned_on : null } : null,
  };
}

const settingsOfRow = (row: DoeFactsRow | undefined): CycleSettings => ({ ...defaultCycleSettings(), ...(row?.settings ?? {}) });

function itemOf(row: DoeFactsRow, today: string, settings: CycleSettings): DoeBoardItemDto {
  const facts = factsOf(row);
  const cycle = doeCycleState(facts, today, settings);
  return {
    id: row.id, name: row.name, tattoo: row.tattoo, hutch: row.hutch, birthDate: row.birth_date, cycle,
    openServiceId: row.service_status === 'open' ? row.service_id : null,
    nursingLitterId: cycle.state === 'nursing' ? row.litter_id : null,
  };
}

const tattooOrder = (a: DoeBoardItemDto, b: DoeBoardItemDto) =>
  (a.tattoo ?? '').localeCompare(b.tattoo ?? '', 'en', { numeric: true, sensitivity: 'base' }) || a.id.localeCompare(b.id);
const stateRank = new Map<string, number>(doeCycleStates.map((s, i) => [s, i]));

const boardOrders: Record<DoeBoardQuery['sort'], (a: DoeBoardItemDto, b: DoeBoardItemDto) => number> = {
  due: (a, b) => compareByDue(a.cycle, b.cycle),
  state: (a, b) => stateRank.get(a.cycle.state)! - stateRank.get(b.cycle.state)! || compareByDue(a.cycle, b.cycle),
  tattoo: () => 0,
  name: (a, b) => a.name.localeCompare(b.name, 'en', { numeric: true, sensitivity: 'base' }),
};

/**
 * The farm's does (an apprentice's: the mentor's), each with where she stands and her next job, sorted and
 * paged. The order "what is due" is the shared state's, so it is computed here rather than in SQL: one row
 * per doe the farm keeps (hundreds at most), read in one statement, then sorted and paged.
 */
export async function doeBoard(actor: SessionUser, q: DoeBoardQuery): Promise<DoeBoardDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Service', { farmId }, 'That doe board');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const rows = await selectPrepared<DoeFactsRow>(tx, doeFactsSql, [actor.coopId, farmId], { onlyStatement: true });
    const settings = settingsOfRow(rows[0]);
    const all = rows.map((row) => itemOf(row, clock.today, settings));
    const order = boardOrders[q.sort];
    const sign = q.dir === 'desc' ? -1 : 1;
    all.sort((a, b) => sign * (order(a, b) || tattooOrder(a, b)));
    const counts: DoeBoardDto['counts'] = {};
    for (const item of all) counts[item.cycle.state] = (counts[item.cycle.state] ?? 0) + 1;
    const start = (q.page - 1) * q.pageSize;
    return {
      farm: { id: farmId, name: clock.name }, today: clock.today,
      items: all.slice(start, start + q.pageSize), total: all.length, page: q.page, pageSize: q.pageSize, counts,
    };
  });
}

interface RecordServiceRow {
  id: string;
  serviced_on: string;
  status: 'open' | 'kindled' | 'empty' | 'missed';
  closed_on: string | null;
  litter_id: string | null;
  buck_id: string;
  buck_name: string | null;
  buck_tattoo: string | null;
  palpated_on: string | null;
  palpation_result: 'positive' | 'negative' | null;
}

interface RecordLitterRow {
  id: string;
  service_id: string;
  kindled_on: string;
  born_alive: number;
  born_dead: number;
  sire_id: string;
  sire_name: string | null;
  sire_tattoo: string | null;
  fostered_in: number;
  fostered_out: number;
  lost: number;
  culled: number;
  weaned: number;
  weaned_on: string | null;
  weaning_grams: number | null;
  weighed_kits: number;
  deaths: Partial<Record<KitDeathCause, number>> | null;
  settings: Partial<CycleSettings> | null;
}

/**
 * A doe's breeding record on the actor's farm: her services with their palpations, her litters with what
 * became of the kits (born, fostered, lost by cause, culled, weaned and their weight), and the figures.
 * Another co-op's doe does not exist; another farm's is known to the co-op (her pedigree card) but her
 * record is that farm's own: 403.
 */
export async function breedingRecord(actor: SessionUser, doeId: string): Promise<BreedingRecordDto> {
  const farmId = farmOf(actor);
  return withTenant(actor, async (tx) => {
    const doe = (await animalFactsOf(tx, actor.coopId, [doeId])).get(doeId);
    if (!doe || doe.isOutside) throw AppError.notFound('That doe');
    authorize(actor, 'read', {
      subject: 'Animal', fields: { owningFarmId: doe.owningFarmId, keepingFarmId: doe.keepingFarmId },
      farmIds: [doe.owningFarmId, doe.keepingFarmId], what: 'That doe', knownToCoop: true,
    }, "Another farm's breeding records are its own");
    ensureCan(actor, 'read', 'Litter', { farmId }, 'That doe');
    if (doe.sex !== 'doe') throw AppError.notFound('That doe');
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const services = await selectPrepared<RecordServiceRow>(tx, `
      SELECT s.id, s.serviced_on::text AS serviced_on, s.status, s.closed_on::text AS closed_on, s.litter_id, s.buck_id,
        b.name AS buck_name, b.tattoo AS buck_tattoo, pl.palpated_on::text AS palpated_on, pl.result AS palpation_result
      FROM services s
      LEFT JOIN animals b ON b.id = s.buck_id
      LEFT JOIN LATERAL (
        SELECT p.palpated_on, p.result FROM palpations p WHERE p.service_id = s.id AND p.review_state = 'accepted' AND p.result <> 'unsure' ORDER BY p.palpated_on DESC, p.created_at DESC LIMIT 1
      ) pl ON true
      WHERE s.coop_id = $1 AND s.farm_id = $2 AND s.doe_id = $3 AND s.deleted_at IS NULL
      ORDER BY s.serviced_on DESC, s.created_at DESC`, [actor.coopId, farmId, doeId]);
    const litters = await selectPrepared<RecordLitterRow>(tx, `
      SELECT l.id, l.service_id, l.kindled_on::text AS kindled_on, l.born_alive, l.born_dead, l.sire_id,
        sire.name AS sire_name, sire.tattoo AS sire_tattoo, ev.*,
        (SELECT s.settings FROM farm_cycle_settings s WHERE s.farm_id = $2) AS settings
      FROM litters l
      LEFT JOIN animals sire ON sire.id = l.sire_id
      LEFT JOIN LATERAL (
        SELECT COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'fostered_in'), 0)::int AS fostered_in,
          COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'fostered_out'), 0)::int AS fostered_out,
          COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'lost'), 0)::int AS lost,
          COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'culled'), 0)::int AS culled,
          COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'weaned'), 0)::int AS weaned,
          (max(e.occurred_on) FILTER (WHERE e.kind = 'weaned'))::text AS weaned_on,
          (sum(e.weaning_weight_grams) FILTER (WHERE e.kind = 'weaned' AND e.weaning_weight_grams IS NOT NULL))::int AS weaning_grams,
          COALESCE(sum(e.kit_count) FILTER (WHERE e.kind = 'weaned' AND e.weaning_weight_grams IS NOT NULL), 0)::int AS weighed_kits,
          (SELECT jsonb_object_agg(cause, n) FROM (
             SELECT COALESCE(d.death_cause, 'other') AS cause, sum(d.kit_count)::int AS n FROM litter_events d
             WHERE d.litter_id = l.id AND d.kind = 'lost' AND d.deleted_at IS NULL AND d.review_state <> 'returned'
             GROUP BY 1) causes) AS deaths
        FROM litter_events e WHERE e.litter_id = l.id AND e.deleted_at IS NULL AND e.review_state <> 'returned'
      ) ev ON true
      WHERE l.coop_id = $1 AND l.farm_id = $2 AND l.dam_id = $3 AND l.deleted_at IS NULL
      ORDER BY l.kindled_on DESC, l.created_at DESC`, [actor.coopId, farmId, doeId]);
    const settings = settingsOfRow(litters[0] as unknown as DoeFactsRow | undefined);
    const latestService = services[0];
    const latestLitter = litters[0];
    const cycle = doeCycleState({
      birthDate: doe.birthDate,
      firstBreedingDays: doe.firstBreedingMinDays?.doe ?? null,
      service: latestService ? {
        servicedOn: latestService.serviced_on, status: latestService.status, closedOn: latestService.closed_on,
        palpation: latestService.palpated_on && latestService.palpation_result ? { palpatedOn: latestService.palpated_on, result: latestService.palpation_result } : null,
      } : null,
      litter: latestLitter ? {
        kindledOn: latestLitter.kindled_on, onDoe: onDoeOf(latestLitter),
        weanedOn: onDoeOf(latestLitter) === 0 && latestLitter.weaned > 0 ? latestLitter.weaned_on : null,
      } : null,
    }, clock.today, settings);
    const ref = (id: string, name: string | null, tattoo: string | null) => (name === null && tattoo === null ? null : { id, name: name ?? '', tattoo });
    return {
      doe: { id: doe.id, name: doe.name, tattoo: doe.tattoo },
      today: clock.today,
      cycle,
      services: services.map((s) => ({
        id: s.id, servicedOn: s.serviced_on, buck: ref(s.buck_id, s.buck_name, s.buck_tattoo), status: s.status, closedOn: s.closed_on,
        palpation: s.palpated_on && s.palpation_result ? { palpatedOn: s.palpated_on, result: s.palpation_result } : null, litterId: s.litter_id,
      })),
      litters: litters.map((l, i) => ({
        id: l.id, serviceId: l.service_id, kindledOn: l.kindled_on, sire: ref(l.sire_id, l.sire_name, l.sire_tattoo),
        bornAlive: l.born_alive, bornDead: l.born_dead, fosteredIn: l.fostered_in, fosteredOut: l.fostered_out, lost: l.lost, culled: l.culled,
        weaned: l.weaned, onDoe: onDoeOf(l), weanedOn: l.weaned_on, weaningWeightGrams: l.weaning_grams,
        daysSincePrevious: litters[i + 1] ? daysBetween(litters[i + 1]!.kindled_on, l.kindled_on) : null,
        deaths: l.deaths ?? {},
      })),
      figures: breedingRecordFigures(
        services.map((s) => ({ servicedOn: s.serviced_on, status: s.status })),
        litters.map((l) => ({
          kindledOn: l.kindled_on, bornAlive: l.born_alive, bornDead: l.born_dead, fosteredIn: l.fostered_in, fosteredOut: l.fostered_out,
          lost: l.lost, culled: l.culled, weaned: l.weaned, weaningWeightGrams: l.weaning_grams, weighedKits: l.weighed_kits, deaths: l.deaths ?? {},
        })),
      ),
    };
  });
}

function onDoeOf(l: Pick<RecordLitterRow, 'born_alive' | 'fostered_in' | 'fostered_out' | 'lost' | 'culled' | 'weaned'>): number {
  return Math.max(0, l.born_alive + l.fostered_in - l.fostered_out - l.lost - l.culled - l.weaned);
}
