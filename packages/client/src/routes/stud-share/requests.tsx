import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { LoanList } from '../../features/stud-share/components/loan-list';

/** /stud-share/requests — what the farm asked for, and where each stands. */
export function RequestsPage() {
  return (
    <div className="space-y-6">
      <PageTitle>My requests</PageTitle>
      <PageHeader title="My requests" lead="Bucks your farm asked for, and where each request stands." />
      <LoanList side="requests" empty="No requests yet. Find a buck for one of your does from the buck cards." />
    </div>
  );
}
