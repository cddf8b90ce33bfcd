import { useState } from 'react';
import { data, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { ApplicationReceiptDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { BrandMark } from '../../components/ui/brand-mark';
import { Card } from '../../components/ui/card';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { publicCoopQueryOptions, usePublicCoop } from '../../features/applications/api/get-public-coop';
import { ApplicationForm } from '../../features/applications/components/application-form';
import { ApplicationReceived } from '../../features/applications/components/application-received';
import { isApiError } from '../../lib/api-client';

const slugPattern = /^[a-z0-9]+(-[a-z0-9]+)*$/;

export async function loader({ params }: LoaderFunctionArgs) {
  const slug = params.coopSlug ?? '';
  if (!slugPattern.test(slug)) throw data('That co-op was not found', { status: 404 });
  try {
    await queryClient.ensureQueryData(publicCoopQueryOptions(slug));
  } catch (error) {
    if (isApiError(error) && error.status === 404) throw data('That co-op was not found', { status: 404 });
    throw error;
  }
  return null;
}

/** `/apply/:coopSlug`: the public form where a breeder asks to join a co-op. */
export function ApplyPage() {
  const slug = useParams().coopSlug ?? '';
  const { data: coop } = usePublicCoop(slug);
  const [receipt, setReceipt] = useState<ApplicationReceiptDto | null>(null);

  return (
    <main className="mx-auto max-w-3xl space-y-6 px-4 py-8 sm:py-12">
      <PageTitle>{`Apply to ${coop.name}`}</PageTitle>
      <div className="text-moss-deep">
        <BrandMark />
      </div>
      <header className="space-y-2">
        <h1 className="text-3xl font-bold tracking-tight">Apply to join {coop.name}</h1>
        <p className="text-lg text-grey-600">
          Member farms share stud bucks, processing days and breeding stock. Tell the coordinator about your farm and
          herd; every application is read by a person.
        </p>
      </header>
      {receipt ? (
        <ApplicationReceived receipt={receipt} />
      ) : (
        <Card>
          <ApplicationForm
            coop={coop}
            onSent={(sent) => {
              setReceipt(sent);
              window.scrollTo({ top: 0 });
            }}
          />
        </Card>
      )}
      <p className="text-center">
        Already a member? <TextLink to="/sign-in">Sign in</TextLink>
      </p>
    </main>
  );
}
