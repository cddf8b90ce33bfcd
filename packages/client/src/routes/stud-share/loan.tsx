import { ArrowLeft } from 'lucide-react';
import { useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { TextLink } from '../../components/ui/text-link';
import { useFarmToday } from '../../features/farms';
import { useWeightUnit } from '../../features/herd';
import { loanQueryOptions, useLoan } from '../../features/stud-share/api/get-loans';
import { BiosecurityCaution } from '../../features/stud-share/components/biosecurity-caution';
import { Facts } from '../../features/stud-share/components/buck-facts';
import { LoanActions } from '../../features/stud-share/components/loan-actions';
import { CustodyStep, LoanHistory, LoanStages } from '../../features/stud-share/components/loan-timeline';
import { kindLabels, periodText, sideOf, stateText, stateTones } from '../../features/stud-share/stud-share-labels';
import { formatDate } from '../../lib/days';
import { errorText } from '../../lib/form-errors';
import { useMoney } from '../../lib/money';
import { useSession } from '../../lib/session';
import { idFrom, useIdParam } from './stud-share-params';
import { ChatThread } from '../../features/chat';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(loanQueryOptions(idFrom(params, 'loanId')));
  return null;
}

/** /stud-share/loans/:loanId — a request, loan or visit as both farms see it: where it stands, what to do, its history. */
export function LoanPage() {
  const loanId = useIdParam('loanId');
  const me = useSession();
  const money = useMoney();
  const unit = useWeightUnit();
  const today = useFarmToday();
  const location = useLocation();
  const loan = useLoan(loanId);
  if (!loan.data) return loan.isError ? <Alert tone="error">{errorText(loan.error)}</Alert> : <PageSpinner />;
  const l = loan.data;
  const side = sideOf(l, me.user.farmId);
  const buck = l.buck.name || l.buck.tattoo || 'The buck';
  const title = side === 'owner' ? `${buck} for ${l.requestingFarm.name}` : `${buck} from ${l.owningFarm.name}`;
  const facts: [string, string][] = [
    ['Kind', kindLabels[l.kind]],
    [l.kind === 'loan' ? 'Dates' : 'Visit', periodText(l.startOn, l.endOn)],
    ...(l.proposedStartOn && l.proposedEndOn && l.state === 'dates_proposed' ? [['Dates offered instead', periodText(l.proposedStartOn, l.proposedEndOn)] as [string, string]] : []),
    ['For', l.does.map((d) => d.name || d.tattoo).join(', ')],
    ['Owner', l.owningFarm.name],
    [l.kind === 'loan' ? 'Borrower' : 'Visiting', l.requestingFarm.name],
    ...(l.feesVisible ? [['Fee', l.feeCents ? money(l.feeCents) : 'No fee'] as [string, string]] : []),
    ...(l.message ? [['Message', l.message] as [string, string]] : []),
    ...(l.declineReason ? [['Reason', l.declineReason] as [string, string]] : []),
  ];
  return (
    <div className="space-y-6">
      <PageTitle>{title}</PageTitle>
      <LinkButton to={side === 'owner' ? '/stud-share/offers' : '/stud-share/requests'} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        {side === 'owner' ? 'Back to my offers' : 'Back to my requests'}
      </LinkButton>
      <PageHeader title={title} lead={`${kindLabels[l.kind]} · ${periodText(l.startOn, l.endOn)}`} />
      <p className="flex flex-wrap items-center gap-2">
        <Badge tone={stateTones[l.state]} className="text-base" >
          <span data-testid="loan-state">{stateText(l.state, side, l.kind)}</span>
        </Badge>
        {l.overdue && <Badge tone="clay" className="text-base">Overdue home</Badge>}
      </p>
      {(location.state as { requested?: boolean } | null)?.requested && l.state === 'requested' && (
        <Alert tone="success">Sent. {l.owningFarm.name} is told now, in Burrowline and by e-mail.</Alert>
      )}
      {l.overdue && (
        <Alert tone="error" title="He is past his last day">
          His loan ended on {formatDate(l.endOn)} and his return is not recorded. Agree a day with the other farm and record it.
        </Alert>
      )}
      <LoanStages loan={l} />
      <LoanActions loan={l} unit={unit} today={today} />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">The request</h2>
          <Facts rows={facts} label="The request" />
          <TextLink to={`/herd/${l.buck.id}`}>{buck}'s pedigree</TextLink>
          {l.kind === 'loan' && <BiosecurityCaution quarantineDays={l.quarantineDays} />}
        </Card>
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Hand-over and return</h2>
          {l.handOver ? <CustodyStep title="Hand-over" step={l.handOver} unit={unit} /> : <p className="text-grey-600">{l.kind === 'loan' ? 'Not handed over yet.' : 'A visit: he stays at home.'}</p>}
          {l.return && <CustodyStep title="Return" step={l.return} unit={unit} />}
        </Card>
      </div>
      <Card className="space-y-4">
        <h2 className="text-xl font-bold">History</h2>
        <LoanHistory loan={l} />
      </Card>
      <Card className="space-y-3">
        <h2 className="text-xl font-bold">Talk between the two farms</h2>
        <ChatThread subject={{ type: 'loan', id: l.id }} />
      </Card>
    </div>
  );
}
