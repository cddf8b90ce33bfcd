import {
  defineAbilityFor, subjectOf, type BuckCardDto, type FarmRefDto, type GetRecordDto, type PedigreeCardDto, type StudCustodyStepDto,
  type StudLoanAction, type StudLoanDto, type StudLoanEventDto, type StudPhotoDto,
} from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { canSeeMoney } from '../farms/farm-access';
import type { LoanEventRow, LoanRow, OfferRow, StudStepRow } from './stud-share-queries';

export interface StudPresentContext {
  actor: SessionUser;
  farms: Map<string, { id: string; name: string }>;
  cards: Map<string, { card: PedigreeCardDto }>;
  names: Map<string, string>;
  today: string;
}

const photoOf = (id: string): StudPhotoDto => ({ id, url: `/api/photos/${id}` });

export function farmRef(ctx: Pick<StudPresentContext, 'farms'>, farmId: string): FarmRefDto {
  const farm = ctx.farms.get(farmId);
  return { id: farmId, name: farm?.name ?? 'A former farm' } as FarmRefDto;
}

/** Members see an offer's fees (it is the co-op's price list); apprentices never see money. */
export function seesFees(actor: SessionUser): boolean {
  return defineAbilityFor(actor).can('create', subjectOf('Loan', { coopId: actor.coopId }));
}

export function canManageOffer(actor: SessionUser, farmId: string): boolean {
  return defineAbilityFor(actor).can('update', subjectOf('StudListing', { coopId: actor.coopId, farmId }));
}

export function presentBuckCard(
  row: OfferRow,
  ctx: StudPresentContext,
  getRecord: GetRecordDto,
  littersAll: number,
): BuckCardDto {
  const fees = seesFees(ctx.actor);
  const canEdit = canManageOffer(ctx.actor, row.farm_id);
  return {
    offerId: row.id,
    version: row.version,
    status: row.status,
    buck: ctx.cards.get(row.buck_id)!.card,
    owningFarm: farmRef(ctx, row.farm_id),
    loan: row.offers_loan,
    service: row.offers_service,
    loanFeeCents: fees ? row.loan_fee_cents : null,
    serviceFeeCents: fees ? row.service_fee_cents : null,
    feesVisible: fees,
    longestLoanDays: row.longest_loan_days,
    restDays: row.rest_days,
    terms: row.terms,
    travelArea: row.travel_area,
    health: {
      lastHealthCheckOn: row.last_health_check_on,
      rhdv2VaccinatedOn: row.rhdv2_vaccinated_on,
      knownConditions: row.known_conditions,
      proven: littersAll > 0,
      littersSired: littersAll,
    },
    weights: row.weights ?? [],
    getRecord,
    photos: (row.photos ?? []).map(photoOf),
    onLoanTo: row.on_loan_to ? farmRef(ctx, row.on_loan_to) : null,
    canEdit,
    canRequest: row.status === 'offered' && fees && ctx.actor.farmId !== null && ctx.actor.farmId !== row.farm_id,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

function presentStep(step: StudStepRow | null, ctx: StudPresentContext): StudCustodyStepDto | null {
  if (!step) return null;
  const person = (id: string | null) => (id ? { id, name: ctx.names.get(id) ?? 'A former member' } : null);
  return {
    on: step.on,
    weightGrams: step.weightGrams,
    conditionNotes: step.conditionNotes,
    photo: step.photoId ? photoOf(step.photoId) : null,
    recordedByFarmId: step.recordedByFarmId,
    recordedBy: person(step.recordedBy)!,
    recordedAt: step.recordedAt,
    confirmedBy: person(step.confirmedBy),
    confirmedAt: step.confirmedAt,
  };
}

/** Which side of the loan the actor's farm is on, and whether they may act (apprentices only read). */
export function sideOf(actor: SessionUser, loan: Pick<LoanRow, 'owner_farm_id' | 'borrower_farm_id'>): 'owner' | 'borrower' | null {
  if (!actor.farmId) return null;
  if (actor.farmId === loan.owner_farm_id) return 'owner';
  if (actor.farmId === loan.borrower_farm_id) return 'borrower';
  return null;
}

function mayAct(actor: SessionUser, loan: LoanRow): boolean {
  return defineAbilityFor(actor).can('update', subjectOf('Loan', { coopId: actor.coopId, ownerFarmId: loan.owner_farm_id, borrowerFarmId: loan.borrower_farm_id }));
}

/** The steps the actor may take now; the services enforce the same rules. */
export function actionsFor(actor: SessionUser, loan: LoanRow): StudLoanAction[] {
  const side = sideOf(actor, loan);
  if (!side || !mayAct(actor, loan)) return [];
  const out: StudLoanAction[] = [];
  const stepFor = (step: StudStepRow | null, record: StudLoanAction, confirm: StudLoanAction) => {
    if (!step) out.push(record);
    else if (!step.confirmedAt && step.recordedByFarmId !== actor.farmId) out.push(confirm);
  };
  switch (loan.state) {
    case 'requested':
      if (side === 'owner') out.push('accept', 'decline', 'propose');
      else out.push('cancel');
      break;
    case 'dates_proposed':
      if (side === 'owner') out.push('decline');
      else out.push('answer_proposal', 'cancel');
      break;
    case 'accepted':
      if (loan.kind === 'service') {
        if (side === 'owner') out.push('record_service');
      } else {
        stepFor(loan.hand_over, 'record_hand_over', 'confirm_hand_over');
      }
      if (side === 'borrower') out.push('cancel');
      break;
    case 'handed_over':
      stepFor(loan.return_step, 'record_return', 'confirm_return');
      break;
    default:
      break;
  }
  return out;
}

export function isOverdue(loan: Pick<LoanRow, 'kind' | 'state' | 'end_on'>, today: string): boolean {
  return loan.kind === 'loan' && loan.state === 'handed_over' && today > loan.end_on;
}

export function presentLoan(loan: LoanRow, events: LoanEventRow[], ctx: StudPresentContext, quarantineDays: number): StudLoanDto {
  const fees = canSeeMoney(ctx.actor, loan.owner_farm_id) || canSeeMoney(ctx.actor, loan.borrower_farm_id);
  const timeline: StudLoanEventDto[] = events.map((e) => ({
    id: e.id,
    kind: e.kind,
    at: e.created_at.toISOString(),
    by: e.actor_id ? { id: e.actor_id, name: e.actor_name ?? 'A former member' } : null,
    farm: e.farm_id ? farmRef(ctx, e.farm_id) : null,
    text: e.text,
  }));
  return {
    id: loan.id,
    version: loan.version,
    kind: loan.kind,
    state: loan.state,
    offerId: loan.offer_id,
    buck: ctx.cards.get(loan.buck_id)!.card,
    owningFarm: farmRef(ctx, loan.owner_farm_id),
    requestingFarm: farmRef(ctx, loan.borrower_farm_id),
    does: loan.doe_ids.map((id) => ctx.cards.get(id)?.card).filter((c): c is PedigreeCardDto => Boolean(c)),
    startOn: loan.start_on,
    endOn: loan.end_on,
    proposedStartOn: loan.proposed_start_on,
    proposedEndOn: loan.proposed_end_on,
    message: loan.message,
    declineReason: loan.decline_reason,
    feeCents: fees ? loan.fee_cents : null,
    feesVisible: fees,
    handOver: presentStep(loan.hand_over, ctx),
    return: presentStep(loan.return_step, ctx),
    overdue: isOverdue(loan, ctx.today),
    quarantineDays,
    timeline,
    actions: actionsFor(ctx.actor, loan),
    createdAt: loan.created_at.toISOString(),
  };
}
