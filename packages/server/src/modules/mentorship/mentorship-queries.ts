import { QueryTypes, type Transaction } from 'sequelize';
import type { ReviewItemKind, ReviewState } from '@burrowline/shared';
import { database } from '../../db/sequelize';

/** Raw reads of the mentorship tables; one query per table, bucketed by the service (no query per row). */
export async function select<T extends object>(tx: Transaction, sql: string, bind: unknown[]): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}

export async function run(tx: Transaction, sql: string, bind: unknown[]): Promise<void> {
  await database().query(sql, { bind, transaction: tx });
}

export interface PersonRow {
  id: string;
  name: string;
  farm_id: string | null;
  mentor_id: string | null;
  role: string;
  farm_name: string | null;
  mentor_name: string | null;
}

const personColumns = `u.id, u.name, u.farm_id, u.mentor_id, u.role, f.name AS farm_name, m.name AS mentor_name
  FROM users u LEFT JOIN farms f ON f.id = u.farm_id LEFT JOIN users m ON m.id = u.mentor_id`;

/** The co-op's active apprentices, all of them or one mentor's. */
export function apprenticesOf(tx: Transaction, coopId: string, mentorId: string | null): Promise<PersonRow[]> {
  return select<PersonRow>(
    tx,
    `SELECT ${personColumns}
      WHERE u.coop_id = $1 AND u.role = 'apprentice' AND u.disabled_at IS NULL AND ($2::uuid IS NULL OR u.mentor_id = $2::uuid)
      ORDER BY lower(u.name), u.id`,
    [coopId, mentorId],
  );
}

export async function personOf(tx: Transaction, coopId: string, userId: string): Promise<PersonRow | null> {
  const rows = await select<PersonRow>(tx, `SELECT ${personColumns} WHERE u.coop_id = $1 AND u.id = $2`, [coopId, userId]);
  return rows[0] ?? null;
}

export interface ChoreRow {
  id: string;
  coop_id: string;
  farm_id: string;
  apprentice_id: string;
  apprentice_name: string;
  mentor_id: string | null;
  kind: string;
  done_on: string;
  minutes: number;
  animal_id: string | null;
  animal_label: string | null;
  litter_id: string | null;
  litter_label: string | null;
  group_id: string | null;
  group_label: string | null;
  notes: string;
  weigh_in_id: string | null;
  weigh_in_grams: number | null;
  weigh_in_heads: number | null;
  weigh_in_version: number | null;
  litter_event_id: string | null;
  litter_event_kind: 'lost' | 'culled' | 'weaned' | null;
  litter_event_count: number | null;
  litter_event_version: number | null;
  palpation_id: string | null;
  palpation_service_id: string | null;
  palpation_result: 'positive' | 'negative' | 'unsure' | null;
  review_state: ReviewState;
  review_comment: string | null;
  reviewed_by: string | null;
  reviewer_name: string | null;
  submitted_at: Date;
  version: number;
}

const choreColumns = `c.id, c.coop_id, c.farm_id, c.apprentice_id, u.name AS apprentice_name, u.mentor_id, c.kind, c.done_on::text AS done_on,
  c.minutes, c.animal_id, concat_ws(' ', a.tattoo, nullif(a.name, '')) AS animal_label,
  c.litter_id, CASE WHEN l.id IS NULL THEN NULL ELSE concat('Litter of ', coalesce(nullif(d.name, ''), d.tattoo), ', ', l.kindled_on::text) END AS litter_label,
  c.group_id, g.name AS group_label, c.notes,
  c.weigh_in_id, w.total_grams AS weigh_in_grams, w.head_count AS weigh_in_heads, w.version AS weigh_in_version,
  c.litter_event_id, e.kind AS litter_event_kind, e.kit_count AS litter_event_count, e.version AS litter_event_version,
  c.palpation_id, p.service_id AS palpation_service_id, p.result AS palpation_result,
  c.review_state, c.review_comment, c.reviewed_by, r.name AS reviewer_name, c.submitted_at, c.version
  FROM chore_entries c
  JOIN users u ON u.id = c.apprentice_id
  LEFT JOIN users r ON r.id = c.reviewed_by
  LEFT JOIN animals a ON a.id = c.animal_id
  LEFT JOIN litters l ON l.id = c.litter_id
  LEFT JOIN animals d ON d.id = l.dam_id
  LEFT JOIN grow_out_groups g ON g.id = c.group_id
  LEFT JOIN weigh_ins w ON w.id = c.weigh_in_id
  LEFT JOIN litter_events e ON e.id = c.litter_event_id
  LEFT JOIN palpations p ON p.id = c.palpation_id`;

export function choresWhere(tx: Transaction, where: string, bind: unknown[], tail = 'ORDER BY c.done_on DESC, c.submitted_at DESC, c.id'): Promise<ChoreRow[]> {
  return select<ChoreRow>(tx, `SELECT ${choreColumns} WHERE c.deleted_at IS NULL AND ${where} ${tail}`, bind);
}

export async function choreById(tx: Transaction, coopId: string, id: string, lock = false): Promise<ChoreRow | null> {
  if (lock) await run(tx, 'SELECT 1 FROM chore_entries WHERE id = $1 AND coop_id = $2 FOR UPDATE', [id, coopId]);
  const rows = await choresWhere(tx, 'c.coop_id = $1 AND c.id = $2', [coopId, id], '');
  return rows[0] ?? null;
}

export interface QueueRow {
  kind: ReviewItemKind;
  id: string;
  apprentice_id: string;
  farm_id: string;
  submitted_at: Date;
  on: string;
  title: string;
  detail: string;
  version: number;
}

/**
 * Everything the given apprentices sent that waits for review, oldest first: their chore entries, and the
 * weigh-ins, notes, litter counts and task ticks they entered elsewhere (those a chore entry carries are
 * reviewed with the entry, so they are not listed twice). A palpation chore is listed as the palpation.
 */
export function pendingOf(tx: Transaction, coopId: string, apprenticeIds: string[], filter: { kind?: ReviewItemKind; id?: string } = {}): Promise<QueueRow[]> {
  const parts: Record<ReviewItemKind, string> = {
    chore: `SELECT 'chore' AS kind, c.id, c.apprentice_id, c.farm_id, c.submitted_at, c.done_on::text AS on, c.kind AS title,
        concat(c.minutes, ' min', CASE WHEN c.notes <> '' THEN concat(' · ', left(c.notes, 120)) ELSE '' END) AS detail, c.version
      FROM chore_entries c WHERE c.coop_id = $1 AND c.apprentice_id = ANY($2::uuid[]) AND c.review_state = 'pending' AND c.deleted_at IS NULL
        AND c.palpation_id IS NULL`,
    palpation: `SELECT 'palpation', p.id, c.apprentice_id, c.farm_id, c.submitted_at, p.palpated_on::text, 'Palpation',
        concat(concat_ws(' ', d.tattoo, nullif(d.name, '')), ': ', CASE p.result WHEN 'negative' THEN 'empty (negative)' WHEN 'unsure' THEN 'not sure' ELSE 'kits felt (positive)' END,
          ', served ', s.serviced_on::text), p.version
      FROM chore_entries c JOIN palpations p ON p.id = c.palpation_id JOIN services s ON s.id = p.service_id LEFT JOIN animals d ON d.id = s.doe_id
      WHERE c.coop_id = $1 AND c.apprentice_id = ANY($2::uuid[]) AND c.review_state = 'pending' AND c.deleted_at IS NULL AND p.review_state = 'pending'`,
    'weigh-in': `SELECT 'weigh-in', w.id, w.entered_by, w.farm_id, w.created_at, w.weighed_on::text, 'Weigh-in',
        concat(coalesce(CASE WHEN a.id IS NULL THEN NULL ELSE concat_ws(' ', a.tattoo, nullif(a.name, '')) END, g.name, w.group_label), ': ', w.total_grams, ' g', CASE WHEN w.head_count > 1 THEN concat(' for ', w.head_count, ' head') ELSE '' END), w.version
      FROM weigh_ins w LEFT JOIN animals a ON a.id = w.animal_id LEFT JOIN grow_out_groups g ON g.id = w.group_id
      WHERE w.coop_id = $1 AND w.entered_by = ANY($2::uuid[]) AND w.review_state = 'pending' AND w.deleted_at IS NULL
        AND NOT EXISTS (SELECT 1 FROM chore_entries c WHERE c.weigh_in_id = w.id)`,
    note: `SELECT 'note', n.id, n.entered_by, n.farm_id, n.created_at, n.noted_on::text, 'Note',
        concat(concat_ws(' ', a.tattoo, nullif(a.name, '')), ': ', left(n.body, 160)), n.version
      FROM animal_notes n LEFT JOIN animals a ON a.id = n.animal_id
      WHERE n.coop_id = $1 AND n.entered_by = ANY($2::uuid[]) AND n.review_state = 'pending' AND n.deleted_at IS NULL`,
    'litter-event': `SELECT 'litter-event', e.id, e.entered_by, e.farm_id, e.created_at, e.occurred_on::text, 'Litter count',
        concat(e.kit_count, ' kit', CASE WHEN e.kit_count = 1 THEN '' ELSE 's' END, ' ', e.kind, ' from the litter of ', coalesce(nullif(d.name, ''), d.tattoo)), e.version
      FROM litter_events e JOIN litters l ON l.id = e.litter_id LEFT JOIN animals d ON d.id = l.dam_id
      WHERE e.coop_id = $1 AND e.entered_by = ANY($2::uuid[]) AND e.review_state = 'pending' AND e.deleted_at IS NULL
        AND NOT EXISTS (SELECT 1 FROM chore_entries c WHERE c.litter_event_id = e.id)`,
    task: `SELECT 'task', t.id, t.done_by, t.farm_id, t.updated_at, coalesce(t.done_on, t.due_on)::text, 'Task ticked',
        concat(replace(t.kind, '_', ' '), CASE WHEN a.id IS NULL THEN '' ELSE concat(' · ', concat_ws(' ', a.tattoo, nullif(a.name, ''))) END), t.version
      FROM almanac_tasks t LEFT JOIN animals a ON a.id = t.animal_id
      WHERE t.coop_id = $1 AND t.done_by = ANY($2::uuid[]) AND t.completion_review = 'pending'`,
  };
  const kinds = filter.kind ? [filter.kind] : (Object.keys(parts) as ReviewItemKind[]);
  // Column names come from each part's position, so one part alone reads like the union.
  const names = '(kind, id, apprentice_id, farm_id, submitted_at, "on", title, detail, version)';
  const union = kinds.map((k) => `SELECT * FROM (${parts[k]}) AS p${names}`).join(' UNION ALL ');
  const byId = filter.id ? 'WHERE q.id = $3::uuid' : '';
  return select<QueueRow>(tx, `SELECT * FROM (${union}) q ${byId} ORDER BY q.submitted_at, q.id LIMIT 500`, filter.id ? [coopId, apprenticeIds, filter.id] : [coopId, apprenticeIds]);
}

export interface SkillRow {
  key: string;
  name: string;
  area: string;
  signed_off_means: string;
  dangerous: boolean;
  position: number;
  retired_at: Date | null;
}

export interface SkillEventRow {
  apprentice_id: string;
  skill_key: string;
  state: 'practising' | 'signed-off' | 'withdrawn';
  on_date: string;
  comment: string;
  entry_ids: string[];
  mentor_id: string;
  mentor_name: string;
  created_at: Date;
}

export function skillEventsOf(tx: Transaction, coopId: string, apprenticeIds: string[]): Promise<SkillEventRow[]> {
  if (apprenticeIds.length === 0) return Promise.resolve([]);
  return select<SkillEventRow>(
    tx,
    `SELECT s.apprentice_id, s.skill_key, s.state, s.on_date::text AS on_date, s.comment, s.entry_ids, s.mentor_id, m.name AS mentor_name, s.created_at
       FROM skill_events s JOIN users m ON m.id = s.mentor_id
      WHERE s.coop_id = $1 AND s.apprentice_id = ANY($2::uuid[]) ORDER BY s.created_at, s.id`,
    [coopId, apprenticeIds],
  );
}

/** Minutes of the apprentices' accepted entries, per apprentice, kind and week (Monday). */
export function acceptedMinutesOf(tx: Transaction, coopId: string, apprenticeIds: string[]): Promise<{ apprentice_id: string; kind: string; week_of: string; minutes: number }[]> {
  if (apprenticeIds.length === 0) return Promise.resolve([]);
  return select(
    tx,
    `SELECT apprentice_id, kind, date_trunc('week', done_on)::date::text AS week_of, sum(minutes)::int AS minutes
       FROM chore_entries WHERE coop_id = $1 AND apprentice_id = ANY($2::uuid[]) AND review_state = 'accepted' AND deleted_at IS NULL
      GROUP BY apprentice_id, kind, week_of ORDER BY week_of`,
    [coopId, apprenticeIds],
  );
}

