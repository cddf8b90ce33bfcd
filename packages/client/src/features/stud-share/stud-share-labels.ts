import type { StudBlockReason, StudKind, StudLoanAction, StudLoanDto, StudLoanState } from '@burrowline/shared';
import type { BadgeTone } from '../../components/ui/badge';
import { formatDate } from '../../lib/days';

export const kindLabels: Record<StudKind, string> = { loan: 'Loan', service: 'Stud service' };
export const kindHints: Record<StudKind, string> = {
  loan: 'He travels to your farm for the dates',
  service: 'Your doe visits him for one day',
};

/** Each state in plain words, as the side that sees it reads it. */
export function stateText(state: StudLoanState, side: 'owner' | 'requester', kind: StudKind): string {
  const visit = kind === 'service';
  switch (state) {
    case 'requested':
      return side === 'owner' ? 'Waiting for your answer' : 'Asked, waiting for the owner';
    case 'dates_proposed':
      return side === 'owner' ? 'Other dates offered, waiting for them' : 'Other dates offered: your answer';
    case 'accepted':
      return visit ? 'Accepted, visit booked' : 'Accepted, not yet handed over';
    case 'declined':
      return 'Declined';
    case 'cancelled':
      return 'Cancelled';
    case 'handed_over':
      return side === 'owner' ? 'Away on loan' : 'With you on loan';
    case 'returned':
      return 'Back home';
    case 'served':
      return 'Visit done';
  }
}

export const stateTones: Record<StudLoanState, BadgeTone> = {
  requested: 'straw', dates_proposed: 'straw', accepted: 'moss', declined: 'clay', cancelled: 'neutral',
  handed_over: 'moss', returned: 'neutral', served: 'neutral',
};

export const blockLabels: Record<StudBlockReason, string> = { loan: 'On loan', own_service: 'Home service', rest: 'Resting' };

export const actionLabels: Record<StudLoanAction, string> = {
  accept: 'Accept', decline: 'Decline', propose: 'Propose other dates', answer_proposal: 'Answer the dates offered', cancel: 'Cancel the request',
  record_hand_over: 'Record the hand-over', confirm_hand_over: 'Confirm the hand-over', record_return: 'Record the return',
  confirm_return: 'Confirm the return', record_service: 'Record the visit as done',
};

/** "3 Mar 2027 – 17 Mar 2027", or one day for a visit. */
export function periodText(startOn: string, endOn: string): string {
  return startOn === endOn ? formatDate(startOn) : `${formatDate(startOn)} – ${formatDate(endOn)}`;
}

/** Which side of the loan the person's farm is on. */
export function sideOf(loan: Pick<StudLoanDto, 'owningFarm'>, farmId: string | null): 'owner' | 'requester' {
  return loan.owningFarm.id === farmId ? 'owner' : 'requester';
}

/** A distance in the co-op's usual words: miles for lb/oz farms, kilometres otherwise. */
export function distanceText(km: number | null, imperial: boolean): string {
  if (km === null) return 'Not known';
  return imperial ? `${Math.round(km / 1.609344)} mi` : `${Math.round(km)} km`;
}
