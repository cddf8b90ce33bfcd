import type { Transaction } from 'sequelize';
import { postTransfer } from '../ledger/ledger.service';
import { rows } from './stud-share-queries';
import { formatDay, formatRange } from './stud-dates';

/** A loan that happened before the co-op used Stud Share, as a farm's records tell it (demo data, imports). */
export interface PastLoan {
  coopId: string;
  offerId: string;
  buckId: string;
  ownerFarmId: string;
  borrowerFarmId: string;
  doeIds: string[];
  startOn: string;
  endOn: string;
  feeCents: number | null;
  ownerUserId: string;
  borrowerUserId: string;
}

/**
 * Writes a returned loan with its history (request, acceptance, hand-over and return, each confirmed by
 * the other farm) and its fee posted, inside the caller's transaction. Dates in the past are the point
 * here, so it bypasses the request rules (from today on) that a live request obeys; the days it held
 * are kept like any loan's, so a live request cannot overlap them either.
 */
export async function importReturnedLoan(tx: Transaction, loan: PastLoan): Promise<string> {
  const at = (date: string) => `${date}T15:00:00.000Z`;
  const step = (on: string, by: string, farm: string, confirmer: string) => ({
    on, weightGrams: null, conditionNotes: '', photoId: null, recordedByFarmId: farm, recordedBy: by, recordedAt: at(on), confirmedBy: confirmer, confirmedAt: at(on),
  });
  const [created] = await rows<{ id: string }>(
    tx,
    `INSERT INTO stud_loans (coop_id, offer_id, buck_id, kind, state, owner_farm_id, borrower_farm_id, doe_ids, start_on, end_on, fee_cents,
       hand_over, return_step, requested_by, created_at)
     VALUES ($1, $2, $3, 'loan', 'returned', $4, $5, $6::uuid[], $7, $8, $9, $10, $11, $12, $13) RETURNING id`,
    [loan.coopId, loan.offerId, loan.buckId, loan.ownerFarmId, loan.borrowerFarmId, loan.doeIds, loan.startOn, loan.endOn, loan.feeCents,
      JSON.stringify(step(loan.startOn, loan.ownerUserId, loan.ownerFarmId, loan.borrowerUserId)),
      JSON.stringify(step(loan.endOn, loan.borrowerUserId, loan.borrowerFarmId, loan.ownerUserId)), loan.borrowerUserId, at(loan.startOn)],
  );
  const id = created!.id;
  const events: [string, string, string, string, string][] = [
    ['requested', loan.borrowerFarmId, loan.borrowerUserId, `Asked for a loan, ${formatRange(loan.startOn, loan.endOn)}`, loan.startOn],
    ['accepted', loan.ownerFarmId, loan.ownerUserId, `Accepted ${formatRange(loan.startOn, loan.endOn)}`, loan.startOn],
    ['hand_over_confirmed', loan.borrowerFarmId, loan.borrowerUserId, `Confirmed the hand-over on ${formatDay(loan.startOn)}`, loan.startOn],
    ['return_confirmed', loan.ownerFarmId, loan.ownerUserId, `Confirmed the return on ${formatDay(loan.endOn)}`, loan.endOn],
  ];
  for (const [kind, farmId, actorId, text, on] of events) {
    await rows(tx, 'INSERT INTO stud_loan_events (coop_id, loan_id, kind, farm_id, actor_id, text, created_at) VALUES ($1, $2, $3, $4, $5, $6, $7)',
      [loan.coopId, id, kind, farmId, actorId, text, at(on)]);
  }
  await rows(
    tx,
    `INSERT INTO stud_bookings (coop_id, buck_id, loan_id, during, held, lane) VALUES ($1, $2, $3, daterange($4::date, $5::date, '[]'), daterange($4::date, $5::date + 1), '(,)')`,
    [loan.coopId, loan.buckId, id, loan.startOn, loan.endOn],
  );
  if (loan.feeCents && loan.feeCents > 0) {
    await postTransfer(tx, {
      id: `loan:${id}:fee`, kind: 'stud_fee', debit: { farmId: loan.borrowerFarmId }, credit: { farmId: loan.ownerFarmId }, amountCents: loan.feeCents,
      sourceType: 'stud_loan', sourceId: id, memo: `Stud fee: loan ${formatRange(loan.startOn, loan.endOn)}`, bookedOn: loan.endOn, postedBy: loan.ownerUserId,
    });
  }
  return id;
}
