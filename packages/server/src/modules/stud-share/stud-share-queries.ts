import { QueryTypes, type Transaction } from 'sequelize';
import type { GetRecordDto, StudEventKind, StudKind, StudLoanState } from '@burrowline/shared';
import { database } from '../../db/sequelize';

/** Plain SQL reads of Stud Share, one statement each, over the current co-op (row-level security holds them to it). */
export async function rows<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}

export interface OfferRow {
  id: string;
  coop_id: string;
  farm_id: string;
  buck_id: string;
  status: 'offered' | 'withdrawn';
  offers_loan: boolean;
  offers_service: boolean;
  loan_fee_cents: number | null;
  service_fee_cents: number | null;
  longest_loan_days: number;
  rest_days: number;
  terms: string;
  travel_area: string;
  last_health_check_on: string | null;
  rhdv2_vaccinated_on: string | null;
  known_conditions: string;
  photo_ids: string[];
  share_weights: boolean;
  version: number;
  created_at: Date;
  updated_at: Date;
  /** Joined per row: his owning farm's weights (when shared), the offer's photos still there, where he is on loan now. */
  weights: { grams: number; weighedOn: string }[] | null;
  photos: string[] | null;
  on_loan_to: string | null;
  total_count?: string;
}

export const OFFER_COLUMNS = `o.id, o.coop_id, o.farm_id, o.buck_id, o.status, o.offers_loan, o.offers_service, o.loan_fee_cents,
  o.service_fee_cents, o.longest_loan_days, o.rest_days, o.terms, o.travel_area, o.last_health_check_on::text AS last_health_check_on,
  o.rhdv2_vaccinated_on::text AS rhdv2_vaccinated_on, o.known_conditions, o.photo_ids, o.share_weights, o.version, o.created_at, o.updated_at`;

/** What a buck card shows beside the offer, joined per row so a page costs one statement. */
export const OFFER_EXTRAS = `
  CASE WHEN o.share_weights THEN (
    SELECT json_agg(json_build_object('grams', w.total_grams, 'weighedOn', w.weighed_on::text) ORDER BY w.weighed_on DESC)
    FROM (SELECT wi.total_grams, wi.weighed_on FROM weigh_ins wi
          WHERE wi.animal_id = o.buck_id AND wi.farm_id = o.farm_id AND wi.deleted_at IS NULL AND wi.review_state = 'accepted'
          ORDER BY wi.weighed_on DESC LIMIT 6) w
  ) END AS weights,
  (SELECT array_agg(p.id ORDER BY array_position(o.photo_ids, p.id)) FROM photos p
   WHERE p.id = ANY(o.photo_ids) AND p.animal_id = o.buck_id AND p.deleted_at IS NULL) AS photos,
  (SELECT CASE WHEN a.keeping_farm_id <> a.owning_farm_id THEN a.keeping_farm_id END FROM animals a WHERE a.id = o.buck_id) AS on_loan_to`;

export async function offerById(tx: Transaction, coopId: string, offerId: string, lock = false): Promise<OfferRow | null> {
  const [row] = await rows<OfferRow>(
    tx,
    `SELECT ${OFFER_COLUMNS}, ${OFFER_EXTRAS} FROM stud_offers o WHERE o.coop_id = $1 AND o.id = $2 ${lock ? 'FOR UPDATE OF o' : ''}`,
    [coopId, offerId],
  );
  return row ?? null;
}

export interface StudStepRow {
  on: string;
  weightGrams: number | null;
  conditionNotes: string;
  photoId: string | null;
  recordedByFarmId: string;
  recordedBy: string;
  recordedAt: string;
  confirmedBy: string | null;
  confirmedAt: string | null;
}

export interface LoanRow {
  id: string;
  coop_id: string;
  offer_id: string;
  buck_id: string;
  kind: StudKind;
  state: StudLoanState;
  owner_farm_id: string;
  borrower_farm_id: string;
  doe_ids: string[];
  start_on: string;
  end_on: string;
  proposed_start_on: string | null;
  proposed_end_on: string | null;
  message: string;
  decline_reason: string | null;
  fee_cents: number | null;
  rest_days: number;
  hand_over: StudStepRow | null;
  return_step: StudStepRow | null;
  overdue_noticed_at: Date | null;
  requested_by: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  total_count?: string;
}

export const LOAN_COLUMNS = `l.id, l.coop_id, l.offer_id, l.buck_id, l.kind, l.state, l.owner_farm_id, l.borrower_farm_id, l.doe_ids,
  l.start_on::text AS start_on, l.end_on::text AS end_on, l.proposed_start_on::text AS proposed_start_on,
  l.proposed_end_on::text AS proposed_end_on, l.message, l.decline_reason, l.fee_cents, l.rest_days, l.hand_over, l.return_step,
  l.overdue_noticed_at, l.requested_by, l.version, l.created_at, l.updated_at`;

export async function loanById(tx: Transaction, coopId: string, loanId: string, lock = false): Promise<LoanRow | null> {
  const [row] = await rows<LoanRow>(tx, `SELECT ${LOAN_COLUMNS} FROM stud_loans l WHERE l.coop_id = $1 AND l.id = $2 ${lock ? 'FOR UPDATE' : ''}`, [coopId, loanId]);
  return row ?? null;
}

export interface LoanEventRow {
  id: string;
  loan_id: string;
  kind: StudEventKind;
  farm_id: string | null;
  actor_id: string | null;
  actor_name: string | null;
  text: string;
  created_at: Date;
}

export async function eventsOfLoans(tx: Transaction, loanIds: string[]): Promise<LoanEventRow[]> {
  if (loanIds.length === 0) return [];
  return rows<LoanEventRow>(
    tx,
    `SELECT e.id, e.loan_id, e.kind, e.farm_id, e.actor_id, u.name AS actor_name, e.text, e.created_at
     FROM stud_loan_events e LEFT JOIN users u ON u.id = e.actor_id
     WHERE e.loan_id = ANY($1::uuid[]) ORDER BY e.created_at, e.id`,
    [loanIds],
  );
}

interface GetRecordRow {
  sire_id: string;
  litters_all: number;
  litters_shared: number;
  mean_born_alive: number | null;
  mean_weaned: number | null;
  mean_daily_gain: number | null;
  mean_days_to_target: number | null;
  mean_dress_out: number | null;
}

/** Fewest weigh-ins of a kit, days apart, for its daily gain to count (common practice: a week's span at least). */
const MIN_GAIN_SPAN_DAYS = 7;

/**
 * The get's records of several sires in one statement: litters he sired (all, for "proven"; those of farms
 * that share their records, for the figures), mean born alive and weaned, his get's mean daily gain between
 * 3 and 17 weeks of age (individual weigh-ins), and from processing records the mean age at slaughter weight
 * (the farm's target) and mean hot dress-out. Only farms that share their records count in the figures.
 */
export async function getRecordsOf(tx: Transaction, coopId: string, sireIds: string[]): Promise<Map<string, { record: GetRecordDto; littersAll: number }>> {
  const out = new Map<string, { record: GetRecordDto; littersAll: number }>();
  if (sireIds.length === 0) return out;
  const found = await rows<GetRecordRow>(
    tx,
    `WITH sires AS (SELECT unnest($2::uuid[]) AS id),
     sharing AS (SELECT id FROM farms WHERE coop_id = $1 AND shares_get_records),
     lit AS (
       SELECT l.sire_id, l.born_alive, l.farm_id IN (SELECT id FROM sharing) AS shared,
              (SELECT sum(e.kit_count) FROM litter_events e WHERE e.litter_id = l.id AND e.kind = 'weaned' AND e.review_state = 'accepted') AS weaned
       FROM litters l WHERE l.coop_id = $1 AND l.sire_id IN (SELECT id FROM sires) AND l.deleted_at IS NULL),
     gain AS (
       SELECT a.sire_id, (max(wi.total_grams) - min(wi.total_grams))::float / (max(wi.weighed_on) - min(wi.weighed_on)) AS adg
       FROM animals a JOIN weigh_ins wi ON wi.animal_id = a.id
       WHERE a.coop_id = $1 AND a.sire_id IN (SELECT id FROM sires) AND a.birth_date IS NOT NULL AND wi.deleted_at IS NULL
         AND wi.review_state = 'accepted' AND wi.farm_id IN (SELECT id FROM sharing) AND wi.weighed_on - a.birth_date BETWEEN 21 AND 119
       GROUP BY a.id, a.sire_id HAVING max(wi.weighed_on) - min(wi.weighed_on) >= ${MIN_GAIN_SPAN_DAYS}),
     processed AS (
       SELECT a.sire_id, pr.age_days, pr.hot_dress_out_percent
       FROM animals a JOIN processing_records pr ON pr.animal_id = a.id
       WHERE a.coop_id = $1 AND a.sire_id IN (SELECT id FROM sires) AND pr.deleted_at IS NULL AND pr.farm_id IN (SELECT id FROM sharing))
     SELECT s.id AS sire_id,
       (SELECT count(*)::int FROM lit WHERE lit.sire_id = s.id) AS litters_all,
       (SELECT count(*)::int FROM lit WHERE lit.sire_id = s.id AND lit.shared) AS litters_shared,
       (SELECT avg(born_alive)::float FROM lit WHERE lit.sire_id = s.id AND lit.shared) AS mean_born_alive,
       (SELECT avg(weaned)::float FROM lit WHERE lit.sire_id = s.id AND lit.shared AND weaned IS NOT NULL) AS mean_weaned,
       (SELECT avg(adg)::float FROM gain WHERE gain.sire_id = s.id) AS mean_daily_gain,
       (SELECT avg(age_days)::float FROM processed WHERE processed.sire_id = s.id AND age_days IS NOT NULL) AS mean_days_to_target,
       (SELECT avg(hot_dress_out_percent)::float / 100 FROM processed WHERE processed.sire_id = s.id) AS mean_dress_out
     FROM sires s`,
    [coopId, [...new Set(sireIds)]],
  );
  const round = (value: number | null, places: number) => (value === null ? null : Number(value.toFixed(places)));
  for (const row of found) {
    out.set(row.sire_id, {
      littersAll: row.litters_all,
      record: {
        littersSired: row.litters_shared,
        meanBornAlive: round(row.mean_born_alive, 1),
        meanWeaned: round(row.mean_weaned, 1),
        meanDailyGainGrams: round(row.mean_daily_gain, 1),
        meanDaysToTarget: round(row.mean_days_to_target, 0),
        meanDressOut: round(row.mean_dress_out, 3),
      },
    });
  }
  return out;
}

export const emptyGetRecord = (): GetRecordDto => ({
  littersSired: 0, meanBornAlive: null, meanWeaned: null, meanDailyGainGrams: null, meanDaysToTarget: null, meanDressOut: null,
});
