import { defineAbilityFor, subjectOf } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { subjectFromRows } from '../chat/chat-subjects.service';

interface LoanRow {
  id: string;
  coop_id: string;
  owner_farm_id: string;
  borrower_farm_id: string;
  buck_name: string;
}

const loansSql = (ids: string) =>
  `SELECT l.id, l.coop_id, l.owner_farm_id, l.borrower_farm_id, coalesce(nullif(a.name, ''), a.tattoo, 'the buck') AS buck_name
     FROM stud_loans l LEFT JOIN animals a ON a.id = l.buck_id
    WHERE l.id = ANY(${ids})`;

const mayReadLoan = (actor: SessionUser, loan: LoanRow) =>
  defineAbilityFor(actor).can('read', subjectOf('Loan', { coopId: loan.coop_id, ownerFarmId: loan.owner_farm_id, borrowerFarmId: loan.borrower_farm_id }));

/** A loan's thread: only its two farms talk about it (their apprentices follow, as they follow the loan). */
export const loanThreadSubject = subjectFromRows<LoanRow>({
  rowsSql: loansSql,
  mayRead: mayReadLoan,
  participants: (_tx, loan) => ({ farmIds: [loan.owner_farm_id, loan.borrower_farm_id], userIds: [] }),
  title: (loan) => (loan ? `Loan of ${loan.buck_name}` : 'A loan'),
  link: (subjectId) => `/stud-share/loans/${subjectId}`,
});
