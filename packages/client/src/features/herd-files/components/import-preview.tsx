import { CheckCircle2 } from 'lucide-react';
import { useState } from 'react';
import type { HerdImportDto, HerdImportRowDto, ImportIssueDto, ImportRowFilter } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Pagination } from '../../../components/ui/data-table';
import { LinkButton } from '../../../components/ui/link-button';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { PageSpinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { useConfirmHerdImport } from '../api/confirm-herd-import';
import { useHerdImport } from '../api/get-herd-import';

const PAGE_SIZE = 50;
const number = new Intl.NumberFormat('en-US');

function plural(n: number, one: string, many = `${one}s`) {
  return `${number.format(n)} ${n === 1 ? one : many}`;
}

function RowStatus({ row }: { row: HerdImportRowDto }) {
  if (row.errors.length > 0) return <Badge tone="clay">Needs fixing</Badge>;
  if (row.action === 'create') return <Badge tone="moss">Add</Badge>;
  if (row.action === 'update') return <Badge tone="straw">Update</Badge>;
  return <Badge>No change</Badge>;
}

function Issues({ row }: { row: HerdImportRowDto }) {
  const item = (issue: ImportIssueDto, i: number, tone: 'error' | 'warning') => (
    <li key={`${tone}-${i}`} className={tone === 'error' ? 'text-clay-deep' : 'text-bark'}>
      <span className="font-semibold">{tone === 'error' ? 'Error' : 'Warning'}{issue.column ? ` (${issue.column})` : ''}:</span> {issue.message}
    </li>
  );
  if (row.errors.length + row.warnings.length + row.changes.length === 0) return <span className="text-grey-500">—</span>;
  return (
    <ul className="space-y-1 text-sm">
      {row.errors.map((e, i) => item(e, i, 'error'))}
      {row.warnings.map((w, i) => item(w, i, 'warning'))}
      {row.changes.map((c) => (
        <li key={c.field} className="text-grey-700">
          <span className="font-semibold">{c.field}:</span> {c.from} → {c.to}
        </li>
      ))}
    </ul>
  );
}

function RowsTable({ rows }: { rows: HerdImportRowDto[] }) {
  return (
    <>
      <div className="hidden overflow-x-auto rounded-2xl border border-grey-200 bg-white shadow-sm md:block">
        <table className="w-full text-left">
          <caption className="sr-only">Rows of the file, with what importing would do</caption>
          <thead className="bg-grey-50 text-sm text-grey-700">
            <tr>
              {['Line', 'Will', 'Tattoo', 'Name', 'Sex', 'Breed', 'Born', 'Sire', 'Dam', 'Errors, warnings and changes'].map((h) => (
                <th key={h} scope="col" className="px-3 py-2 font-semibold whitespace-nowrap">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.line} className={cn('border-t border-grey-100 align-top', row.errors.length > 0 && 'bg-clay-wash/40')}>
                <td className="px-3 py-2 tabular-nums">{row.line}</td>
                <td className="px-3 py-2">
                  <RowStatus row={row} />
                </td>
                <td className="px-3 py-2 font-semibold whitespace-nowrap">{row.tattoo || '—'}</td>
                <td className="px-3 py-2">{row.name}</td>
                <td className="px-3 py-2">{row.sex}</td>
                <td className="px-3 py-2">{row.breed}</td>
                <td className="px-3 py-2 whitespace-nowrap">{row.born}</td>
                <td className="px-3 py-2">{row.sire}</td>
                <td className="px-3 py-2">{row.dam}</td>
                <td className="max-w-md px-3 py-2">
                  <Issues row={row} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul className="space-y-3 md:hidden" aria-label="Rows of the file">
        {rows.map((row) => (
          <li key={row.line} className={cn('space-y-2 rounded-2xl border bg-white p-4 shadow-sm', row.errors.length > 0 ? 'border-clay/50' : 'border-grey-200')}>
            <div className="flex items-center justify-between gap-3">
              <p className="font-semibold">
                Line {row.line}: {row.tattoo || 'no tattoo'} {row.name && `· ${row.name}`}
              </p>
              <RowStatus row={row} />
            </div>
            <p className="text-sm text-grey-700">
              {[row.sex, row.breed, row.born && `born ${row.born}`, row.sire && `sire ${row.sire}`, row.dam && `dam ${row.dam}`].filter(Boolean).join(' · ')}
            </p>
            {row.errors.length + row.warnings.length + row.changes.length > 0 && <Issues row={row} />}
          </li>
        ))}
      </ul>
    </>
  );
}

function Summary({ preview }: { preview: HerdImportDto }) {
  const s = preview.summary;
  const tiles = [
    { label: 'To add', value: s.create, tone: 'text-moss-deep' },
    { label: 'To update', value: s.update, tone: 'text-bark' },
    { label: 'No change', value: s.unchanged, tone: 'text-grey-700' },
    { label: 'Need fixing', value: s.withErrors, tone: s.withErrors > 0 ? 'text-clay-deep' : 'text-grey-700' },
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      {tiles.map((t) => (
        <div key={t.label} className="rounded-xl border border-grey-200 bg-white p-3">
          <dt className="text-sm font-semibold text-grey-600">{t.label}</dt>
          <dd className={cn('text-2xl font-bold tabular-nums', t.tone)}>{number.format(t.value)}</dd>
        </div>
      ))}
    </dl>
  );
}

/**
 * The preview of a staged file: counts, the rows (all, or only those with problems, or by what would
 * happen), each with its line number and reasons, and the confirm, which is offered only when no
 * row has an error.
 */
export function ImportPreview({ importId }: { importId: string }) {
  const [show, setShow] = useState<ImportRowFilter>('all');
  const [page, setPage] = useState(1);
  const preview = useHerdImport(importId, { show, page, pageSize: PAGE_SIZE });
  const confirm = useConfirmHerdImport(importId);
  // One key per preview: a double click or a retried request imports once.
  const [idempotencyKey] = useState(newIdempotencyKey);

  if (!preview.data) return preview.isError ? <Alert tone="error">{preview.error.message}</Alert> : <PageSpinner />;
  const data = preview.data;
  const s = data.summary;

  if (data.status === 'confirmed' && data.result) {
    const r = data.result;
    return (
      <Card className="space-y-4">
        <Alert tone="success" title={`Imported ${data.fileName}`}>
          {plural(r.created, 'animal')} added, {plural(r.updated, 'animal')} updated, {plural(r.weighIns, 'weigh-in')} recorded. COI and breed make-up were
          recomputed ({plural(r.figuresChanged, 'animal')} of the co-op changed).
        </Alert>
        <LinkButton to="/herd" variant="primary">
          <CheckCircle2 className="size-5" aria-hidden="true" />
          See the Herd
        </LinkButton>
      </Card>
    );
  }

  const filters: { value: ImportRowFilter; label: string; count: number }[] = [
    { value: 'all', label: 'All rows', count: s.rows },
    { value: 'problems', label: 'With problems', count: s.withProblems },
    { value: 'create', label: 'To add', count: s.create },
    { value: 'update', label: 'To update', count: s.update },
    { value: 'unchanged', label: 'No change', count: s.unchanged },
  ];
  const what = [s.create > 0 && `add ${plural(s.create, 'animal')}`, s.update > 0 && `update ${plural(s.update, 'animal')}`].filter(Boolean).join(' and ');

  return (
    <div className="space-y-5">
      <div className="space-y-1">
        <h2 className="text-xl font-bold tracking-tight">Preview of {data.fileName}</h2>
        <p className="text-sm text-grey-600">
          {plural(s.rows, 'row')} checked against your herd
        </p>
      </div>
      <Summary preview={data} />
      {s.withErrors > 0 ? (
        <Alert tone="error" title={`${plural(s.withErrors, 'row')} ${s.withErrors === 1 ? 'needs' : 'need'} fixing`}>
          Nothing has been added. Correct those lines in your spreadsheet (the line numbers match the file), save it as CSV and upload it again above.
        </Alert>
      ) : s.withWarnings > 0 ? (
        <Alert tone="warning" title={`${plural(s.withWarnings, 'row')} with a warning`}>
          Look them over; confirming imports them as they are.
        </Alert>
      ) : null}
      {(s.columns.ignored.length > 0 || s.columns.computed.length > 0) && (
        <Alert tone="info">
          Columns not imported: {[...s.columns.ignored, ...s.columns.computed].join(', ')}
          {s.columns.computed.length > 0 && ' (computed by Burrowline, so read past)'}.
        </Alert>
      )}
      <SegmentedFilter
        label="Show rows"
        options={filters}
        value={show}
        onChange={(value) => {
          setShow(value);
          setPage(1);
        }}
      />
      <div className={cn('transition-opacity', preview.isPlaceholderData && 'opacity-60')}>
        {data.rows.items.length === 0 ? (
          <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-6 text-center text-grey-600">No rows here.</p>
        ) : (
          <RowsTable rows={data.rows.items} />
        )}
      </div>
      <Pagination page={data.rows.page} pageSize={data.rows.pageSize} total={data.rows.total} noun="rows" onPage={setPage} />
      <Card className="flex flex-wrap items-center justify-between gap-4">
        <p className="text-bark">
          {data.canConfirm
            ? `Confirming will ${what}${s.weighIns > 0 ? ` and record ${plural(s.weighIns, 'weigh-in')}` : ''}, in one step.`
            : s.withErrors > 0
              ? 'Fix the rows with errors first.'
              : 'Every row is already in your herd as written: nothing to import.'}
        </p>
        <Button disabled={!data.canConfirm} isBusy={confirm.isPending} onClick={() => confirm.mutate(idempotencyKey)}>
          Confirm import
        </Button>
      </Card>
      {confirm.isError && <Alert tone="error">{confirm.error.message}</Alert>}
    </div>
  );
}
