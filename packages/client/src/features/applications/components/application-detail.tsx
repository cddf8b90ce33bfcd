import { Mail, Phone } from 'lucide-react';
import { useEffect, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { ApplicationDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { formatInstant } from '../../../lib/dates';
import { BreedTags } from '../../farms';
import { useMarkApplicationViewed } from '../api/mark-application-viewed';
import { sharingLabels } from '../application-labels';
import { ApplicationStatusBadge } from './application-status-badge';
import { DecisionPanel } from './decision-panel';

function Fact({ term, children, wide = false }: { term: string; children: ReactNode; wide?: boolean }) {
  return (
    <div className={wide ? 'space-y-1 sm:col-span-2' : 'space-y-1'}>
      <dt className="text-sm font-medium text-grey-600">{term}</dt>
      <dd className="break-words whitespace-pre-line">{children}</dd>
    </div>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Card className="space-y-4">
      <h2 className="text-xl font-bold">{title}</h2>
      {children}
    </Card>
  );
}

function Outcome({ application }: { application: ApplicationDto }) {
  const by = application.reviewedBy?.name ?? 'An admin';
  const when = application.reviewedAt ? formatInstant(application.reviewedAt) : '';
  switch (application.status) {
    case 'approved':
      return (
        <Alert tone="success" title={`Approved by ${by} on ${when}`}>
          {application.member?.name ?? application.applicantName} is a member now
          {application.farm && (
            <>
              , with{' '}
              <Link to={`/farms/${application.farm.id}`} className="font-semibold underline underline-offset-4">
                {application.farm.name}
              </Link>{' '}
              in the directory
            </>
          )}
          . Their link to set a password was e-mailed to {application.email}; if it is lost or expired, send a new one from{' '}
          {application.member ? (
            <Link to={`/admin/members/${application.member.id}`} className="font-semibold underline underline-offset-4">
              their member page
            </Link>
          ) : (
            'their member page'
          )}
          .
        </Alert>
      );
    case 'rejected':
      return (
        <Alert tone="info" title={`Not admitted: rejected by ${by} on ${when}`}>
          Reason sent to the applicant: {application.decisionNote}
        </Alert>
      );
    case 'withdrawn':
      return (
        <Alert tone="info" title={`Withdrawn, recorded by ${by} on ${when}`}>
          {application.decisionNote || 'No note was added.'}
        </Alert>
      );
    default:
      return null;
  }
}

/** Everything the applicant wrote, the decision (or the panel to make it), and the biosecurity caution. */
export function ApplicationDetail({ application }: { application: ApplicationDto }) {
  const markViewed = useMarkApplicationViewed();
  const [conflict, setConflict] = useState<string | null>(null);
  const { mutate } = markViewed;

  useEffect(() => {
    if (application.isNew) mutate(application.id);
  }, [application.id, application.isNew, mutate]);

  return (
    <div className="space-y-6">
      <PageHeader
        title={application.applicantName}
        lead={`${application.farmName} · ${application.location}`}
        actions={<ApplicationStatusBadge status={application.status} />}
      />
      <p className="text-grey-600">Sent {formatInstant(application.submittedAt)}</p>
      {conflict && (
        <Alert tone="warning" title="Someone else decided first">
          {conflict}
        </Alert>
      )}
      {application.status === 'pending' ? <DecisionPanel application={application} onConflict={setConflict} /> : <Outcome application={application} />}

      <div className="grid gap-6 lg:grid-cols-2">
        <Section title="Contact">
          <dl className="grid gap-4 sm:grid-cols-2">
            <Fact term="E-mail">
              <a href={`mailto:${application.email}`} className="inline-flex min-h-11 items-center gap-2 text-moss-deep underline underline-offset-4">
                <Mail className="size-4" aria-hidden="true" />
                {application.email}
              </a>
            </Fact>
            <Fact term="Phone">
              {application.phone ? (
                <a href={`tel:${application.phone}`} className="inline-flex min-h-11 items-center gap-2 text-moss-deep underline underline-offset-4">
                  <Phone className="size-4" aria-hidden="true" />
                  {application.phone}
                </a>
              ) : (
                <span className="text-grey-600">Not given</span>
              )}
            </Fact>
          </dl>
        </Section>

        <Section title="Farm">
          <dl className="grid gap-4 sm:grid-cols-2">
            <Fact term="Farm name">{application.farmName}</Fact>
            <Fact term="Location">{application.location}</Fact>
            <Fact term="Time zone">{application.timeZone}</Fact>
            <Fact term="Breeds kept" wide>
              <BreedTags breeds={application.breedsKept} />
            </Fact>
          </dl>
        </Section>

        <Section title="Herd and biosecurity">
          <dl className="grid gap-4 sm:grid-cols-2">
            <Fact term="Breeding does">{application.does}</Fact>
            <Fact term="Breeding bucks">{application.bucks}</Fact>
            <Fact term="How they quarantine new stock" wide>
              {application.quarantinePractice}
            </Fact>
            <Fact term="Disease in the herd in the last year" wide>
              {application.diseaseLastYear ? <strong>Yes</strong> : 'No'}
              {application.diseaseLastYear && <span className="mt-1 block">{application.diseaseDetails}</span>}
            </Fact>
          </dl>
          {application.diseaseLastYear && (
            <Alert tone="warning" title="Disease reported">
              Ask what it was, how it was cleared and whether a veterinarian was involved before their animals meet the
              co-op's. A frank answer is a good sign.
            </Alert>
          )}
          <p className="text-sm text-grey-600">
            Whatever the answers, new or returning animals should be isolated before they join any member's herd; 30 days
            is a common recommendation for RHDV2.
          </p>
        </Section>

        <Section title="Working together">
          <dl className="grid gap-4">
            <Fact term="Hopes to share">
              {application.sharing.length ? application.sharing.map((s) => sharingLabels[s]).join(', ') : <span className="text-grey-600">Nothing ticked</span>}
            </Fact>
            {application.sharingNotes && <Fact term="In their words">{application.sharingNotes}</Fact>}
          </dl>
        </Section>
      </div>

      <Section title="The co-op's rules">
        <p>Agreed to on {formatInstant(application.rulesAgreedAt)}.</p>
        <details className="rounded-xl border border-grey-200 bg-oat/60 p-4">
          <summary className="min-h-11 cursor-pointer py-2 font-semibold">The rules as they read then</summary>
          <div className="pt-2 whitespace-pre-line">{application.rulesTextAgreed || 'No rules were written at the time.'}</div>
        </details>
      </Section>
    </div>
  );
}
