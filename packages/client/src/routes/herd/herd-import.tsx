import { ArrowLeft } from 'lucide-react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { herdImportQueryOptions, useHerdImport } from '../../features/herd-files/api/get-herd-import';
import { ImportFormatHelp } from '../../features/herd-files/components/import-format-help';
import { ImportPreview } from '../../features/herd-files/components/import-preview';
import { ImportUpload } from '../../features/herd-files/components/import-upload';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function importIdOf(params: URLSearchParams): string | null {
  const id = params.get('import');
  return id && uuidPattern.test(id) ? id : null;
}

/** A preview stays in the address (`?import=`), so a reload shows it again. */
export async function loader({ request }: LoaderFunctionArgs) {
  const importId = importIdOf(new URL(request.url).searchParams);
  if (importId) await queryClient.prefetchQuery(herdImportQueryOptions(importId, { show: 'all', page: 1, pageSize: 50 }));
  return null;
}

export function HerdImportPage() {
  const [params, setParams] = useSearchParams();
  const importId = importIdOf(params);
  const current = useHerdImport(importId, { show: 'all', page: 1, pageSize: 50 });
  const needsFixing = Boolean(current.data && current.data.status === 'ready' && current.data.summary.withErrors > 0);
  const done = current.data?.status === 'confirmed';

  return (
    <div className="space-y-6">
      <PageTitle>Import a herd spreadsheet</PageTitle>
      <LinkButton to="/herd" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to Herd
      </LinkButton>
      <PageHeader title="Import a herd spreadsheet" lead="Bring years of records in from a spreadsheet. You see every row checked before anything is added." />
      {/* Once imported, the outcome comes first; before that, the file. */}
      {done && importId && <ImportPreview key={importId} importId={importId} />}
      <Card className="space-y-4">
        <h2 className="text-xl font-bold tracking-tight">{needsFixing ? 'Upload the fixed file' : done ? 'Import another file' : 'Choose the file'}</h2>
        <ImportUpload again={needsFixing} onStaged={(preview) => setParams({ import: preview.id })} />
        <ImportFormatHelp />
      </Card>
      {!done && importId && <ImportPreview key={importId} importId={importId} />}
    </div>
  );
}
