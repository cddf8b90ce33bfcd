import type { Transaction } from 'sequelize';
import {
  defineAbilityFor, ErrorCode, subjectOf, type NotificationKind, type StudCustodyStepInput, type StudEventKind, type StudLoanDto,
  type StudLoanListDto, type StudLoanListQuery, type StudLoanState, type StudProposalAnswerInput, type StudProposeInput,
  type StudRequestInput, type StudVersionInput,
} from '@burrowline/shared';
import { exclusionViolationOf } from '../../db/database-errors';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJobIn, handleJobs } from '../../lib/mail-outbox';
import type { SessionUser } from '../../lib/session-user';
import { moveAnimalInTransaction } from '../animals/custody-moves.service';
import { recordAudit } from '../audit/audit.service';
import { getCoop } from '../coops/coops.service';
import { authorize, type FieldMessages } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { postPending, postTransfer, voidPending } from '../ledger/ledger.service';
import { notify } from '../notifications/notifications.service';
import { announceLoan, studContextFor } from './stud-share-context';
import { presentLoan, sideOf } from './stud-share.presenter';
import { eventsOfLoans, LOAN_COLUMNS, loanById, offerById, rows, type LoanRow, type StudStepRow } from './stud-share-queries';
import { dayAfter, daysBetween, formatDay, formatRange } from './stud-dates';

/** The queue of the overdue-return job (created by migration 0065). */
export const STUD_OVERDUE_QUEUE = 'stud-return-overdue';
/** How far ahead a request may reach. */
const MAX_DAYS_AHEAD = 400;

const feeTransferId = (loan: Pick<LoanRow, 'id' | 'kind'>) => (loan.kind === 'loan' ? `loan:${loan.id}:fee` : `stud-service:${loan.id}:fee`);
const linkOf = (loanId: string) => `/stud-share/loans/${loanId}`;

// ------------------------------------------------------------------------------------------------
// Reading
// ------------------------------------------------------------------------------------------------

/** A loan the actor's farm is party to; for anyone else it does not exist (404). */
async function loanFor(tx: Transaction, actor: SessionUser, loanId: string, action: 'read' | 'update', lock = false): Promise<LoanRow> {
  const loan = await loanById(tx, actor.coopId, loanId, lock);
  if (!loan) throw AppError.notFound('That request');
  authorize(
    actor,
    action,
    { subject: 'Loan', fields: { ownerFarmId: loan.owner_farm_id, borrowerFarmId: loan.borrower_farm_id }, farmIds: [loan.owner_farm_id, loan.borrower_farm_id], what: 'That request' },
    'Only the members of the two farms act on a loan; apprentices follow it',
  );
  return loan;
}

async function presentLoans(tx: Transaction, actor: SessionUser, loans: LoanRow[]): Promise<StudLoanDto[]> {
  if (loans.length === 0) return [];
  const events = await eventsOfLoans(tx, loans.map((l) => l.id));
  const steps = loans.flatMap((l) => [l.hand_over, l.return_step]).filter((s): s is StudStepRow => Boolean(s));
  const ctx = await studContextFor(tx, actor, loans.flatMap((l) => [l.buck_id, ...l.doe_ids]), steps.flatMap((s) => [s.recordedBy, s.confirmedBy]));
  const coop = await getCoop(actor.coopId, tx);
  return loans.map((loan) => presentLoan(loan, events.filter((e) => e.loan_id === loan.id), ctx, coop?.quarantineDays ?? 0));
}

/** One request or loan with its timeline, for the two farms. */
export async function getLoan(actor: SessionUser, loanId: string): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => (await presentLoans(tx, actor, [await loanFor(tx, actor, loanId, 'read')]))[0]!);
}

/** The requests the actor's farm made (`requests`) or received for its bucks (`offers`), newest first. */
export async function listLoans(actor: SessionUser, q: StudLoanListQuery): Promise<StudLoanListDto> {
  if (!actor.farmId || !defineAbilityFor(actor).can('read', subjectOf('Loan', { coopId: actor.coopId, ownerFarmId: actor.farmId, borrowerFarmId: actor.farmId }))) {
    throw new AppError(ErrorCode.forbidden, 403, 'Only the people of a farm follow its loans');
  }
  return withTenant(actor, async (tx) => {
    const bind: unknown[] = [actor.coopId, actor.farmId];
    const where = [q.side === 'requests' ? 'l.borrower_farm_id = $2' : 'l.owner_farm_id = $2'];
    if (q.state) {
      bind.push(q.state);
      where.push(`l.state = $${bind.length}`);
    }
    if (q.open) where.push(`l.state IN ('requested', 'dates_proposed', 'accepted', 'handed_over')`);
    const clause = where.join(' AND ');
    const page = await rows<LoanRow>(
      tx,
      `SELECT ${LOAN_COLUMNS}, count(*) OVER () AS total_count FROM stud_loans l WHERE l.coop_id = $1 AND ${clause}
       ORDER BY l.created_at DESC, l.id LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`,
      bind,
    );
    let total = page.length > 0 ? Number(page[0]!.total_count) : 0;
    if (page.length === 0 && q.page > 1) {
      const [count] = await rows<{ count: string }>(tx, `SELECT count(*) FROM stud_loans l WHERE l.coop_id = $1 AND ${clause}`, bind);
      total = Number(count?.count ?? 0);
    }
    return { items: await presentLoans(tx, actor, page), total, page: q.page, pageSize: q.pageSize };
  });
}

// ------------------------------------------------------------------------------------------------
// Steps
// ------------------------------------------------------------------------------------------------

interface Step {
  kind: StudEventKind;
  text: string;
  details?: Record<string, unknown>;
}

/** Appends a step to the loan's history and the audit log, and announces it to the two farms. */
async function recordStep(tx: Transaction, actor: SessionUser, loan: LoanRow, state: StudLoanState, step: Step): Promise<void> {
  await rows(
    tx,
    'INSERT INTO stud_loan_events (coop_id, loan_id, kind, farm_id, actor_id, text, details) VALUES ($1, $2, $3, $4, $5, $6, $7)',
    [actor.coopId, loan.id, step.kind, actor.farmId, actor.id, step.text, JSON.stringify(step.details ?? {})],
  );
  await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: `stud_loan.${step.kind}`, subjectType: 'stud_loan', subjectId: loan.id, details: { state, ...(step.details ?? {}) } }, tx);
  announceLoan(tx, loan, state);
}

/** Changes the loan from the version the actor saw (else 409), bumping it. */
async function update(tx: Transaction, loan: LoanRow, version: number, set: Record<string, unknown>): Promise<void> {
  if (loan.version !== version) throw AppError.staleVersion();
  const columns = Object.keys(set);
  await rows(
    tx,
    `UPDATE stud_loans SET ${columns.map((c, i) => `${c} = $${i + 3}`).join(', ')}, version = version + 1, updated_at = now() WHERE coop_id = $1 AND id = $2`,
    [loan.coop_id, loan.id, ...columns.map((c) => (set[c] !== null && typeof set[c] === 'object' ? JSON.stringify(set[c]) : set[c]))],
  );
}

function requireSide(actor: SessionUser, loan: LoanRow, side: 'owner' | 'borrower', refusal: string): void {
  if (sideOf(actor, loan) !== side) throw new AppError(ErrorCode.forbidden, 403, refusal);
}

function requireState(loan: LoanRow, states: StudLoanState[], refusal: string): void {
  if (!states.includes(loan.state)) throw new AppError(ErrorCode.conflict, 409, refusal);
}

/** Tells the other farm (never a third one), by the bell and e-mail per each person's choice. */
async function tell(
  tx: Transaction,
  actor: SessionUser,
  loan: LoanRow,
  kind: NotificationKind,
  key: string,
  title: string,
  farmIds: string[] = [loan.owner_farm_id, loan.borrower_farm_id],
): Promise<void> {
  await notify(tx, {
    coopId: actor.coopId,
    farmIds,
    exceptUserId: actor.id,
    kind,
    title,
    link: linkOf(loan.id),
    mail: { subject: title, text: `${title}.\n\nOpen the request to see its history and what to do next.` },
    key: `${key}:${loan.id}`,
  });
}

async function labels(tx: Transaction, actor: SessionUser, loan: LoanRow): Promise<{ buck: string; does: string }> {
  const ctx = await studContextFor(tx, actor, [loan.buck_id, ...loan.doe_ids]);
  return {
    buck: ctx.cardFacts.get(loan.buck_id)?.label ?? 'the buck',
    does: loan.doe_ids.map((id) => ctx.cardFacts.get(id)?.label).filter(Boolean).join(', '),
  };
}

async function answer(tx: Transaction, actor: SessionUser, loanId: string): Promise<StudLoanDto> {
  return (await presentLoans(tx, actor, [(await loanById(tx, actor.coopId, loanId))!]))[0]!;
}

/** Checks dates against the farm's today, the co-op's horizon and the offer's longest loan. */
function checkDates(
  errors: FieldMessages,
  fields: { start: string; end: string },
  dates: { startOn: string; endOn: string },
  today: string,
  kind: LoanRow['kind'],
  longestLoanDays: number,
): void {
  if (dates.startOn < today) errors[fields.start] = ['Choose a date from today on'];
  else if (daysBetween(today, dates.startOn) > MAX_DAYS_AHEAD) errors[fields.start] = [`Ask at most ${MAX_DAYS_AHEAD} days ahead`];
  if (kind === 'loan' && daysBetween(dates.startOn, dates.endOn) + 1 > longestLoanDays) {
    errors[fields.end] = [`He is lent for ${longestLoanDays} days at most`];
  }
}

/** Holds the buck's days in the database; a clash with another booking is a 409 that names the days. */
async function holdDays(tx: Transaction, loan: LoanRow, startOn: string, endOn: string, restDays: number, buckLabel: string): Promise<void> {
  try {
    await rows(
      tx,
      `INSERT INTO stud_bookings (coop_id, buck_id, loan_id, during, held, lane)
       VALUES ($1, $2, $3, daterange($4::date, $5::date, '[]'),
               CASE WHEN $7 = 'loan' THEN daterange($4::date, $5::date + 1 + $6::int) ELSE 'empty'::daterange END, '(,)'::int8range)`,
      [loan.coop_id, loan.buck_id, loan.id, startOn, endOn, restDays, loan.kind],
    );
  } catch (error) {
    const constraint = exclusionViolationOf(error);
    if (constraint === null) throw error;
    const why = constraint === 'stud_bookings_rest_between_loans'
      ? `${buckLabel} rests at home between loans, and another loan is too close to ${formatRange(startOn, endOn)}`
      : `${buckLabel} is already lent, visited or serving at home on some of ${formatRange(startOn, endOn)}`;
    throw new AppError(ErrorCode.conflict, 409, `${why}; this request stays as it was: propose other dates or decline it`);
  }
}

async function chargeFee(tx: Transaction, actor: SessionUser, loan: LoanRow, buckLabel: string, startOn: string, endOn: string): Promise<void> {
  if (!loan.fee_cents || loan.fee_cents <= 0) return;
  await postTransfer(tx, {
    id: feeTransferId(loan),
    kind: 'stud_fee',
    debit: { farmId: loan.borrower_farm_id },
    credit: { farmId: loan.owner_farm_id },
    amountCents: loan.fee_cents,
    pending: true,
    sourceType: 'stud_loan',
    sourceId: loan.id,
    memo: `Stud fee: ${buckLabel}, ${loan.kind === 'loan' ? 'loan' : 'service'} ${formatRange(startOn, endOn)}`,
    postedBy: actor.id,
  });
}

/**
 * Asks for a buck: a loan over dates, or a stud-service visit on a day, for the farm's doe(s). The owner
 * is told at once. A repeated client id answers the original request.
 */
export async function requestStud(actor: SessionUser, input: StudRequestInput): Promise<{ loan: StudLoanDto; created: boolean }> {
  return withTenant(actor, async (tx) => {
    if (input.id) {
      const existing = await loanById(tx, actor.coopId, input.id);
      if (existing) {
        if (existing.requested_by !== actor.id) throw AppError.idTaken();
        return { loan: (await presentLoans(tx, actor, [existing]))[0]!, created: false };
      }
    }
    const offer = await offerById(tx, actor.coopId, input.offerId);
    if (!offer || (offer.status !== 'offered' && offer.farm_id !== actor.farmId)) throw AppError.notFound('That offer');
    authorize(actor, 'create', { subject: 'Loan', fields: {}, farmIds: [], what: 'That offer', knownToCoop: true }, 'Only members of a farm ask for a buck');
    if (input.farmId !== actor.farmId) throw new AppError(ErrorCode.forbidden, 403, 'Ask for your own farm');
    const errors: FieldMessages = {};
    if (offer.status !== 'offered') errors.offerId = ['That offer is withdrawn'];
    if (offer.farm_id === input.farmId) errors.offerId = ['He is your own farm\'s buck'];
    if (input.kind === 'loan' && !offer.offers_loan) errors.kind = ['He is not offered on loan; ask for a stud service'];
    if (input.kind === 'service' && !offer.offers_service) errors.kind = ['He is not offered for stud service; ask for a loan'];
    const ctx = await studContextFor(tx, actor, [offer.buck_id, ...input.doeIds]);
    input.doeIds.forEach((id, i) => {
      const doe = ctx.cardFacts.get(id);
      if (!doe || doe.keepingFarmId !== input.farmId || !doe.onFarm) errors[`doeIds.${i}`] = ['Choose a doe your farm keeps'];
      else if (doe.sex !== 'doe') errors[`doeIds.${i}`] = [`${doe.label} is a buck; choose a doe`];
    });
    if (new Set(input.doeIds).size !== input.doeIds.length) errors.doeIds = ['Name each doe once'];
    checkDates(errors, { start: 'startOn', end: 'endOn' }, input, ctx.today, input.kind, offer.longest_loan_days);
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);

    const fee = input.kind === 'loan' ? offer.loan_fee_cents : offer.service_fee_cents;
    const [created] = await rows<{ id: string }>(
      tx,
      `INSERT INTO stud_loans (id, coop_id, offer_id, buck_id, kind, owner_farm_id, borrower_farm_id, doe_ids, start_on, end_on, message, fee_cents, rest_days, requested_by)
       VALUES (coalesce($1::uuid, gen_random_uuid()), $2, $3, $4, $5, $6, $7, $8::uuid[], $9, $10, $11, $12, $13, $14) RETURNING id`,
      [input.id ?? null, actor.coopId, offer.id, offer.buck_id, input.kind, offer.farm_id, input.farmId, input.doeIds, input.startOn, input.endOn,
        input.message, fee, offer.rest_days, actor.id],
    );
    const loan = (await loanById(tx, actor.coopId, created!.id))!;
    const buck = ctx.cardFacts.get(offer.buck_id)!.label;
    const range = formatRange(input.startOn, input.endOn);
    const what = input.kind === 'loan' ? `a loan of ${buck}, ${range}` : `a stud service with ${buck} on ${range}`;
    await recordStep(tx, actor, loan, 'requested', { kind: 'requested', text: `Asked for ${what}${input.message ? `: “${input.message}”` : ''}` });
    await tell(tx, actor, loan, 'stud.requested', 'stud-requested', `${actor.name} asks for ${buck}, ${range}`, [loan.owner_farm_id]);
    return { loan: await answer(tx, actor, loan.id), created: true };
  });
}

/**
 * The owner accepts: the buck's days are held by the database (two accepts at once: one wins, the
 * other answers 409), and the fee goes into the Ledger as pending, from the borrower to the owner.
 */
export async function acceptRequest(actor: SessionUser, loanId: string, input: StudVersionInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    requireSide(actor, loan, 'owner', 'The buck\'s own farm accepts a request');
    requireState(loan, ['requested'], `This request is ${loan.state.replace('_', ' ')}; it cannot be accepted now`);
    const { buck } = await labels(tx, actor, loan);
    await update(tx, loan, input.version, { state: 'accepted' });
    await holdDays(tx, loan, loan.start_on, loan.end_on, loan.rest_days, buck);
    await chargeFee(tx, actor, loan, buck, loan.start_on, loan.end_on);
    await recordStep(tx, actor, loan, 'accepted', { kind: 'accepted', text: `Accepted ${formatRange(loan.start_on, loan.end_on)}` });
    await tell(tx, actor, loan, 'stud.answered', 'stud-accepted', `${actor.name} accepts your request for ${buck}, ${formatRange(loan.start_on, loan.end_on)}`, [loan.borrower_farm_id]);
    return answer(tx, actor, loanId);
  });
}

/** The owner declines, with a reason the requester reads. */
export async function declineRequest(actor: SessionUser, loanId: string, input: { version: number; reason: string }): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    requireSide(actor, loan, 'owner', 'The buck\'s own farm declines a request');
    requireState(loan, ['requested', 'dates_proposed'], `This request is ${loan.state.replace('_', ' ')}; it cannot be declined now`);
    const { buck } = await labels(tx, actor, loan);
    await update(tx, loan, input.version, { state: 'declined', decline_reason: input.reason, proposed_start_on: null, proposed_end_on: null });
    await recordStep(tx, actor, loan, 'declined', { kind: 'declined', text: `Declined: ${input.reason}` });
    await tell(tx, actor, loan, 'stud.answered', 'stud-declined', `${actor.name} declines your request for ${buck}: ${input.reason}`, [loan.borrower_farm_id]);
    return answer(tx, actor, loanId);
  });
}

/** The owner proposes other dates; the requester accepts or declines them. */
export async function proposeDates(actor: SessionUser, loanId: string, input: StudProposeInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    requireSide(actor, loan, 'owner', 'The buck\'s own farm proposes other dates');
    requireState(loan, ['requested', 'dates_proposed'], `This request is ${loan.state.replace('_', ' ')}; no dates can be proposed now`);
    const offer = (await offerById(tx, actor.coopId, loan.offer_id))!;
    const errors: FieldMessages = {};
    if (loan.kind === 'service' && input.startOn !== input.endOn) errors.endOn = ['A stud service is one visit day'];
    const directory = await farmDirectoryOf(actor.coopId, tx);
    checkDates(errors, { start: 'startOn', end: 'endOn' }, input, farmTodayIn(directory, loan.borrower_farm_id), loan.kind, offer.longest_loan_days);
    if (input.startOn === loan.start_on && input.endOn === loan.end_on) errors.startOn = ['Those are the dates asked for: accept the request instead'];
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const { buck } = await labels(tx, actor, loan);
    const range = formatRange(input.startOn, input.endOn);
    await update(tx, loan, input.version, { state: 'dates_proposed', proposed_start_on: input.startOn, proposed_end_on: input.endOn });
    await recordStep(tx, actor, loan, 'dates_proposed', { kind: 'dates_proposed', text: `Proposed ${range} instead${input.message ? `: “${input.message}”` : ''}` });
    await tell(tx, actor, loan, 'stud.dates-proposed', `stud-proposed-${input.startOn}-${input.endOn}`, `${actor.name} proposes ${range} for ${buck}`, [loan.borrower_farm_id]);
    return answer(tx, actor, loanId);
  });
}

/** The requester answers the owner's proposal: accepting it books the new dates (as an acceptance does). */
export async function answerProposal(actor: SessionUser, loanId: string, input: StudProposalAnswerInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    requireSide(actor, loan, 'borrower', 'The farm that asked answers the proposal');
    requireState(loan, ['dates_proposed'], 'There is no proposal waiting for an answer');
    const { buck } = await labels(tx, actor, loan);
    const start = loan.proposed_start_on!;
    const end = loan.proposed_end_on!;
    const range = formatRange(start, end);
    if (input.accept) {
      await update(tx, loan, input.version, { state: 'accepted', start_on: start, end_on: end, proposed_start_on: null, proposed_end_on: null });
      const moved = { ...loan, start_on: start, end_on: end };
      await holdDays(tx, moved, start, end, loan.rest_days, buck);
      await chargeFee(tx, actor, moved, buck, start, end);
      await recordStep(tx, actor, loan, 'accepted', { kind: 'proposal_accepted', text: `Accepted the proposed ${range}` });
      await tell(tx, actor, loan, 'stud.answered', 'stud-proposal-accepted', `${actor.name} accepts ${range} for ${buck}`, [loan.owner_farm_id]);
    } else {
      await update(tx, loan, input.version, { state: 'cancelled', proposed_start_on: null, proposed_end_on: null });
      await recordStep(tx, actor, loan, 'cancelled', { kind: 'proposal_declined', text: `Declined the proposed ${range}${input.reason ? `: ${input.reason}` : ''}` });
      await tell(tx, actor, loan, 'stud.answered', 'stud-proposal-declined', `${actor.name} declines ${range} for ${buck}`, [loan.owner_farm_id]);
    }
    return answer(tx, actor, loanId);
  });
}

/** The requester cancels, until the hand-over: the days are freed and a pending fee is voided. */
export async function cancelRequest(actor: SessionUser, loanId: string, input: StudVersionInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    requireSide(actor, loan, 'borrower', 'The farm that asked cancels its request');
    requireState(loan, ['requested', 'dates_proposed', 'accepted'], loan.state === 'handed_over'
      ? 'He is handed over already: record his return instead'
      : `This request is ${loan.state.replace('_', ' ')} already`);
    const { buck } = await labels(tx, actor, loan);
    await update(tx, loan, input.version, { state: 'cancelled', proposed_start_on: null, proposed_end_on: null, hand_over: null });
    if (loan.state === 'accepted') {
      await rows(tx, 'DELETE FROM stud_bookings WHERE loan_id = $1', [loan.id]);
      if (loan.fee_cents && loan.fee_cents > 0) await voidPending(tx, feeTransferId(loan));
    }
    await recordStep(tx, actor, loan, 'cancelled', { kind: 'cancelled', text: `Cancelled${input.reason ? `: ${input.reason}` : ''}` });
    await tell(tx, actor, loan, 'stud.cancelled', 'stud-cancelled', `${actor.name} cancels the request for ${buck}, ${formatRange(loan.start_on, loan.end_on)}`, [loan.owner_farm_id]);
    return answer(tx, actor, loanId);
  });
}

/** Checks a recorded hand-over or return; the photo is one of the buck's, taken by the recording farm. */
async function checkStep(tx: Transaction, actor: SessionUser, loan: LoanRow, step: 'hand_over' | 'return', input: StudCustodyStepInput): Promise<void> {
  const errors: FieldMessages = {};
  const directory = await farmDirectoryOf(actor.coopId, tx);
  const today = farmTodayIn(directory, actor.farmId);
  if (input.on > today) errors.on = ['It cannot be recorded before it happens'];
  if (step === 'hand_over' && (input.on < loan.start_on || input.on > loan.end_on)) errors.on = [`Hand him over within the loan, ${formatRange(loan.start_on, loan.end_on)}`];
  if (step === 'return' && loan.hand_over && input.on < loan.hand_over.on) errors.on = [`He was handed over on ${formatDay(loan.hand_over.on)}`];
  if (input.photoId) {
    const [photo] = await rows<{ id: string }>(tx, 'SELECT id FROM photos WHERE id = $1 AND animal_id = $2 AND farm_id = $3 AND deleted_at IS NULL', [input.photoId, loan.buck_id, actor.farmId]);
    if (!photo) errors.photoId = ['Upload the photo of him first (from his page), then pick it'];
  }
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);
}

const stepColumn = (step: 'hand_over' | 'return') => (step === 'hand_over' ? 'hand_over' : 'return_step');

/** One farm records the hand-over or the return (date, his weight, condition, a photo); the other confirms it. */
export async function recordCustodyStep(actor: SessionUser, loanId: string, step: 'hand_over' | 'return', input: StudCustodyStepInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    if (loan.kind !== 'loan') throw new AppError(ErrorCode.conflict, 409, 'A stud service has no hand-over: record the service instead');
    requireState(loan, [step === 'hand_over' ? 'accepted' : 'handed_over'], step === 'hand_over' ? `The request is ${loan.state.replace('_', ' ')}; nothing to hand over` : 'He is not away on this loan');
    if (loan[stepColumn(step)]) throw new AppError(ErrorCode.conflict, 409, `The ${step === 'hand_over' ? 'hand-over' : 'return'} is recorded already; the other farm confirms it`);
    await checkStep(tx, actor, loan, step, input);
    const row: StudStepRow = {
      on: input.on, weightGrams: input.weightGrams, conditionNotes: input.conditionNotes, photoId: input.photoId,
      recordedByFarmId: actor.farmId!, recordedBy: actor.id, recordedAt: new Date().toISOString(), confirmedBy: null, confirmedAt: null,
    };
    await update(tx, loan, input.version, { [stepColumn(step)]: row });
    const { buck } = await labels(tx, actor, loan);
    const weight = input.weightGrams ? `, ${input.weightGrams} g` : '';
    const word = step === 'hand_over' ? 'hand-over' : 'return';
    await recordStep(tx, actor, loan, loan.state, { kind: step === 'hand_over' ? 'hand_over_recorded' : 'return_recorded', text: `Recorded the ${word} on ${formatDay(input.on)}${weight}` });
    await tell(tx, actor, loan, step === 'hand_over' ? 'stud.handed-over' : 'stud.returned', `stud-${word}-recorded`,
      `${actor.name} recorded the ${word} of ${buck} on ${formatDay(input.on)}; please confirm it`);
    return answer(tx, actor, loanId);
  });
}

/**
 * The other farm confirms: at the hand-over his keeping farm becomes the borrower (custody history, the
 * quarantine on its Almanac, the overdue check queued for the day after the loan); at the return he
 * comes home (quarantine there, his days freed from the return on, the fee posted).
 */
export async function confirmCustodyStep(actor: SessionUser, loanId: string, step: 'hand_over' | 'return', input: StudVersionInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    const recorded = loan[stepColumn(step)];
    const word = step === 'hand_over' ? 'hand-over' : 'return';
    if (!recorded) throw new AppError(ErrorCode.conflict, 409, `No ${word} is recorded yet`);
    if (recorded.confirmedAt) throw new AppError(ErrorCode.conflict, 409, `The ${word} is confirmed already`);
    if (recorded.recordedByFarmId === actor.farmId) throw new AppError(ErrorCode.forbidden, 403, `The other farm confirms the ${word} your farm recorded`);
    const confirmed = { ...recorded, confirmedBy: actor.id, confirmedAt: new Date().toISOString() };
    const { buck } = await labels(tx, actor, loan);
    if (step === 'hand_over') {
      await update(tx, loan, input.version, { hand_over: confirmed, state: 'handed_over' });
      await moveAnimalInTransaction(tx, actor, loan.buck_id, { kind: 'lent', toFarmId: loan.borrower_farm_id, movedOn: recorded.on, note: 'Stud Share loan' });
      await enqueueJobIn(tx, STUD_OVERDUE_QUEUE, { coopId: actor.coopId, loanId: loan.id }, { startAfter: new Date(`${dayAfter(loan.end_on)}T12:00:00Z`) });
      await recordStep(tx, actor, loan, 'handed_over', { kind: 'hand_over_confirmed', text: `Confirmed the hand-over on ${formatDay(recorded.on)}` });
      await tell(tx, actor, loan, 'stud.handed-over', 'stud-handed-over', `${buck} is handed over (${formatDay(recorded.on)}); back by ${formatDay(loan.end_on)}`);
    } else {
      await update(tx, loan, input.version, { return_step: confirmed, state: 'returned' });
      await moveAnimalInTransaction(tx, actor, loan.buck_id, { kind: 'returned', movedOn: recorded.on, note: 'Back from a Stud Share loan' });
      // Back early: his days after the return are free again (a late return keeps what was held).
      await rows(
        tx,
        `UPDATE stud_bookings SET during = daterange(lower(during), least(upper(during), $2::date + 1)),
           held = daterange(lower(during), least(upper(held), $2::date + 1 + $3::int))
         WHERE loan_id = $1`,
        [loan.id, recorded.on, loan.rest_days],
      );
      if (loan.fee_cents && loan.fee_cents > 0) await postPending(tx, feeTransferId(loan), actor.id);
      await recordStep(tx, actor, loan, 'returned', { kind: 'return_confirmed', text: `Confirmed the return on ${formatDay(recorded.on)}` });
      await tell(tx, actor, loan, 'stud.returned', 'stud-returned', `${buck} is back home (${formatDay(recorded.on)})`);
    }
    return answer(tx, actor, loanId);
  });
}

/** The owner records that the doe's visit happened: the service fee is posted. */
export async function recordServiceVisit(actor: SessionUser, loanId: string, input: StudVersionInput): Promise<StudLoanDto> {
  return withTenant(actor, async (tx) => {
    const loan = await loanFor(tx, actor, loanId, 'update', true);
    if (loan.kind !== 'service') throw new AppError(ErrorCode.conflict, 409, 'A loan is handed over and returned, not served');
    requireSide(actor, loan, 'owner', 'The buck\'s own farm records the visit');
    requireState(loan, ['accepted'], `This request is ${loan.state.replace('_', ' ')}; there is no visit to record`);
    const directory = await farmDirectoryOf(actor.coopId, tx);
    if (farmTodayIn(directory, actor.farmId) < loan.start_on) throw AppError.validation({ version: [`The visit is on ${formatDay(loan.start_on)}; record it then`] });
    const { buck } = await labels(tx, actor, loan);
    await update(tx, loan, input.version, { state: 'served' });
    if (loan.fee_cents && loan.fee_cents > 0) await postPending(tx, feeTransferId(loan), actor.id);
    await recordStep(tx, actor, loan, 'served', { kind: 'served', text: `Recorded the visit of ${formatDay(loan.start_on)}` });
    await tell(tx, actor, loan, 'stud.returned', 'stud-served', `${actor.name} recorded the stud service with ${buck} on ${formatDay(loan.start_on)}`, [loan.borrower_farm_id]);
    return answer(tx, actor, loanId);
  });
}

// ------------------------------------------------------------------------------------------------
// Overdue returns (a pg-boss job per handed-over loan, for the day after its last day)
// ------------------------------------------------------------------------------------------------

export interface OverdueJob {
  coopId: string;
  loanId: string;
}

/**
 * Tells both farms once that a buck is a day past his return (bell and e-mail); a loan returned in
 * time, or not yet overdue on the borrower's clock, is left (the latter checked again later). Safe to
 * run twice: the notice is written once per loan.
 */
export async function checkReturnOverdue(job: OverdueJob, now: Date = new Date()): Promise<'told' | 'not overdue' | 'already told' | 'back'> {
  return withTenant({ coopId: job.coopId }, async (tx) => {
    const loan = await loanById(tx, job.coopId, job.loanId, true);
    if (!loan || loan.state !== 'handed_over') return 'back';
    const directory = await farmDirectoryOf(job.coopId, tx);
    const today = farmTodayIn(directory, loan.borrower_farm_id, now);
    if (today <= loan.end_on) {
      await enqueueJobIn(tx, STUD_OVERDUE_QUEUE, job, { startAfter: new Date(now.getTime() + 6 * 3_600_000) });
      return 'not overdue';
    }
    if (loan.overdue_noticed_at) return 'already told';
    await rows(tx, 'UPDATE stud_loans SET overdue_noticed_at = $2 WHERE id = $1', [loan.id, now]);
    const farms = directory;
    const [buck] = await rows<{ name: string; tattoo: string | null }>(tx, 'SELECT name, tattoo FROM animals WHERE id = $1', [loan.buck_id]);
    const label = buck ? [buck.name, buck.tattoo ? `(${buck.tattoo})` : ''].filter(Boolean).join(' ') : 'The buck';
    const text = `${label} was due back at ${farms.get(loan.owner_farm_id)?.name ?? 'his farm'} on ${formatDay(loan.end_on)}`;
    await rows(
      tx,
      'INSERT INTO stud_loan_events (coop_id, loan_id, kind, text) VALUES ($1, $2, $3, $4)',
      [job.coopId, loan.id, 'overdue', `${text} and is not back yet`],
    );
    await notify(tx, {
      coopId: job.coopId,
      farmIds: [loan.owner_farm_id, loan.borrower_farm_id],
      kind: 'stud.return-overdue',
      title: `Overdue: ${text}`,
      link: linkOf(loan.id),
      mail: { subject: `Overdue: ${label} is not back yet`, text: `${text} and his return is not recorded yet.\n\nAgree a day between the two farms and record the return.` },
      key: `stud-overdue:${loan.id}`,
    });
    announceLoan(tx, loan, loan.state);
    return 'told';
  });
}

handleJobs<OverdueJob>(STUD_OVERDUE_QUEUE, async (job) => {
  await checkReturnOverdue(job);
});
