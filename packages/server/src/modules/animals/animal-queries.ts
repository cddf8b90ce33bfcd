import { QueryTypes, type Transaction } from 'sequelize';
import type { Disposition, Lifecycle, Purity, ReviewState, Sex } from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';
import { database } from '../../db/sequelize';

/** An animal with its pedigree figures (and, for full records, its latest weight), as SQL returns it. */
export interface AnimalRow {
  id: string;
  coop_id: string;
  is_outside: boolean;
  breeding_farm_id: string | null;
  breeder_name: string;
  owning_farm_id: string | null;
  keeping_farm_id: string | null;
  tattoo: string | null;
  name: string;
  sex: Sex;
  breed_id: string | null;
  colour: string;
  birth_date: string | null;
  sire_id: string | null;
  dam_id: string | null;
  registration_number: string | null;
  notes: string;
  hutch: string;
  lifecycle: Lifecycle;
  disposition: Disposition;
  disposition_cause: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  coi: number | null;
  makeup_breeds: Record<string, number> | null;
  makeup_unknown: number | null;
  purity: Purity | null;
  latest_grams: number | null;
  latest_weighed_on: string | null;
  latest_review_state: ReviewState | null;
}

const columns = `
  a.id, a.coop_id, a.is_outside, a.breeding_farm_id, a.breeder_name, a.owning_farm_id, a.keeping_farm_id,
  a.tattoo, a.name, a.sex, a.breed_id, a.colour, a.birth_date::text AS birth_date, a.sire_id, a.dam_id,
  a.registration_number, a.notes, a.hutch, a.lifecycle, a.disposition, a.disposition_cause, a.version,
  a.created_at, a.updated_at, i.coi, m.breeds AS makeup_breeds, m.unknown AS makeup_unknown, m.purity`;

const figures = `
  LEFT JOIN animal_inbreeding i ON i.animal_id = a.id
  LEFT JOIN animal_breed_makeups m ON m.animal_id = a.id`;

/**
 * The private records of animal `a` (alias `record`, with a `farm_id`) that the viewer's farm (`viewer`, a
 * positional parameter) reads: its own, and, on an animal it owns, those of a farm that owned it (a sold
 * animal's history). The SQL twin of the ability's private-record rules, for bulk reads.
 */
export function privateRecordScopeSql(record: string, viewer: string): string {
  return `(${record}.farm_id = ${viewer} OR (a.owning_farm_id = ${viewer} AND EXISTS (
    SELECT 1 FROM animal_custody_events owner_event
    WHERE owner_event.animal_id = a.id AND owner_event.owning_farm_id = ${record}.farm_id)))`;
}

// Returned entries do not count; a pending one shows (as unverified) until it is reviewed.
const latestWeight = (viewer: string) => `
  LEFT JOIN LATERAL (
    SELECT wi.total_grams, wi.weighed_on, wi.review_state FROM weigh_ins wi
    WHERE wi.animal_id = a.id AND wi.deleted_at IS NULL AND wi.review_state <> 'returned'
      AND ${privateRecordScopeSql('wi', viewer)}
    ORDER BY wi.weighed_on DESC, wi.created_at DESC LIMIT 1
  ) w ON true`;

/**
 * Animals of the current co-op matching `where` (SQL over alias `a`, with `$1` = the co-op id and
 * further positional parameters in `bind`). `weightsSeenBy` adds the latest weigh-in that farm may read
 * (farm-private: only for full records, never for pedigree cards).
 */
export async function selectAnimals(
  tx: Transaction,
  coopId: string,
  where: string,
  bind: unknown[] = [],
  opts: { weightsSeenBy?: string | null; orderBy?: string; limit?: number; offset?: number } = {},
): Promise<AnimalRow[]> {
  const withWeights = Boolean(opts.weightsSeenBy);
  const params = withWeights ? [...bind, opts.weightsSeenBy] : bind;
  const weightColumns = withWeights
    ? ', w.total_grams AS latest_grams, w.weighed_on::text AS latest_weighed_on, w.review_state AS latest_review_state'
    : ', NULL::integer AS latest_grams, NULL::text AS latest_weighed_on, NULL::text AS latest_review_state';
  const sql = `SELECT ${columns}${weightColumns} FROM animals a ${figures} ${withWeights ? latestWeight(`$${params.length + 1}`) : ''}
    WHERE a.coop_id = $1 AND a.deleted_at IS NULL AND (${where})
    ${opts.orderBy ? `ORDER BY ${opts.orderBy}` : ''} ${opts.limit ? `LIMIT ${Math.floor(opts.limit)}` : ''}
    ${opts.offset ? `OFFSET ${Math.floor(opts.offset)}` : ''}`;
  return database().query<AnimalRow>(sql, { bind: [coopId, ...params], type: QueryTypes.SELECT, transaction: tx });
}

/** A row of the herd list: only what the list shows and its access check need. */
export type HerdListRow = Pick<
  AnimalRow,
  | 'id' | 'coop_id' | 'owning_farm_id' | 'keeping_farm_id' | 'tattoo' | 'name' | 'sex' | 'breed_id' | 'birth_date' | 'hutch'
  | 'lifecycle' | 'disposition' | 'coi' | 'makeup_breeds' | 'makeup_unknown' | 'purity' | 'latest_grams' | 'latest_weighed_on' | 'latest_review_state'
> & { total: number; cycle_facts?: unknown };

const listColumns = `
  a.id, a.coop_id, a.owning_farm_id, a.keeping_farm_id, a.tattoo, a.name, a.sex, a.breed_id,
  a.birth_date::text AS birth_date, a.hutch, a.lifecycle, a.disposition, i.coi,
  m.breeds AS makeup_breeds, m.unknown AS makeup_unknown, m.purity`;

/**
 * The animals of a page (`pageSql` yields `id`, `position` and `total`), each with its own figures and
 * latest weight looked up by key: the figures are joined after paging, so the co-op's other rows are never
 * read. `full` reads whole records (the export), else only what the list shows.
 */
async function selectPage<Row extends object>(
  tx: Transaction, pageSql: string, bind: unknown[], weightsSeenBy: string, full: boolean, extraColumn?: string,
): Promise<Row[]> {
  const viewer = `$${bind.length + 1}`;
  const sql = `WITH page AS MATERIALIZED (${pageSql})
    SELECT ${full ? columns : listColumns}, page.total::int AS total,${extraColumn ? ` ${extraColumn} AS cycle_facts,` : ''}
      w.total_grams AS latest_grams, w.weighed_on::text AS latest_weighed_on, w.review_state AS latest_review_state
    FROM page JOIN animals a ON a.id = page.id
    LEFT JOIN LATERAL (SELECT fi.coi FROM animal_inbreeding fi WHERE fi.animal_id = a.id LIMIT 1) i ON true
    LEFT JOIN LATERAL (
      SELECT fm.breeds, fm.unknown, fm.purity FROM animal_breed_makeups fm WHERE fm.animal_id = a.id LIMIT 1
    ) m ON true
    ${latestWeight(viewer)}
    ORDER BY page.position`;
  // The page is all its list reads (a page past the end reads its count after: it then opens again).
  return selectPrepared<Row>(tx, sql, [...bind, weightsSeenBy], { onlyStatement: true });
}

/** The herd list's page; `cycleFactsColumn` (of animal `a`) is read as `cycle_facts`. */
export function selectHerdListPage(tx: Transaction, pageSql: string, bind: unknown[], weightsSeenBy: string, cycleFactsColumn?: string): Promise<HerdListRow[]> {
  return selectPage<HerdListRow>(tx, pageSql, bind, weightsSeenBy, false, cycleFactsColumn);
}

export function selectAnimalPage(tx: Transaction, pageSql: string, bind: unknown[], weightsSeenBy: string): Promise<(AnimalRow & { total: number })[]> {
  return selectPage<AnimalRow & { total: number }>(tx, pageSql, bind, weightsSeenBy, true);
}

export async function selectAnimalById(tx: Transaction, coopId: string, id: string, opts: { weightsSeenBy?: string | null } = {}) {
  const [row] = await selectAnimals(tx, coopId, 'a.id = $2', [id], opts);
  return row ?? null;
}

export async function selectAnimalsByIds(tx: Transaction, coopId: string, ids: string[], opts: { weightsSeenBy?: string | null } = {}) {
  if (ids.length === 0) return [];
  return selectAnimals(tx, coopId, 'a.id = ANY($2::uuid[])', [ids], opts);
}

/** The animal and its ancestors up to `generations` back (ids with their parents), for pictures and completeness. */
export async function selectAncestorIds(tx: Transaction, coopId: string, id: string, generations: number): Promise<string[]> {
  const rows = await database().query<{ id: string }>(
    `WITH RECURSIVE anc(id, depth) AS (
       SELECT $2::uuid, 0
       UNION
       SELECT p.parent_id, anc.depth + 1
       FROM anc JOIN animals a ON a.id = anc.id AND a.coop_id = $1
       CROSS JOIN LATERAL (VALUES (a.sire_id), (a.dam_id)) AS p(parent_id)
       WHERE p.parent_id IS NOT NULL AND anc.depth < $3
     )
     SELECT DISTINCT id FROM anc`,
    { bind: [coopId, id, generations], type: QueryTypes.SELECT, transaction: tx },
  );
  return rows.map((r) => r.id);
}

/** An animal with its ancestors to `generations` back, each as id and parents, in one statement. */
export async function selectAncestry(tx: Transaction, coopId: string, id: string, generations: number): Promise<{ id: string; sire_id: string | null; dam_id: string | null }[]> {
  return database().query(
    `WITH RECURSIVE anc(id, depth) AS (
       SELECT $2::uuid, 0
       UNION
       SELECT p.parent_id, anc.depth + 1
       FROM anc JOIN animals a ON a.id = anc.id AND a.coop_id = $1
       CROSS JOIN LATERAL (VALUES (a.sire_id), (a.dam_id)) AS p(parent_id)
       WHERE p.parent_id IS NOT NULL AND anc.depth < $3
     )
     SELECT id, sire_id, dam_id FROM animals WHERE coop_id = $1 AND id IN (SELECT id FROM anc)`,
    { bind: [coopId, id, generations], type: QueryTypes.SELECT, transaction: tx },
  );
}

export async function query<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}
