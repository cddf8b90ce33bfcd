import { optionalImportColumns, requiredImportColumns, weightColumns } from '@burrowline/shared';

const example = ['HR-14,Thistle,doe,New Zealand,2024-03-02,HR-2,HR-7', 'HR-15,Bramble,buck,cross,2024-03-02,HR-2,HR-7', 'QF-3,Larkin,doe,unknown,2023-11-20,,'];

/** How the spreadsheet must look: the columns, what each holds, and a few example lines. */
export function ImportFormatHelp() {
  return (
    <details className="rounded-xl border border-grey-200 bg-white p-4">
      <summary className="min-h-11 cursor-pointer content-center font-semibold text-moss-deep">How the spreadsheet should look</summary>
      <div className="space-y-3 pt-2 text-grey-700">
        <p>
          Save it as <strong>CSV (UTF-8)</strong>. The first line names the columns; each further line is one animal. These columns are needed:{' '}
          <code className="rounded bg-grey-100 px-1">{requiredImportColumns.join(',')}</code>
        </p>
        <ul className="list-disc space-y-1 pl-5">
          <li><strong>sex</strong>: doe or buck. <strong>born</strong>: the date as YYYY-MM-DD.</li>
          <li><strong>breed</strong>: a breed of the co-op's list, <em>cross</em> (the make-up then comes from the parents), or <em>unknown</em>.</li>
          <li><strong>sire</strong> and <strong>dam</strong>: tattoos of animals in the same file or already in your herd; leave blank when unknown.</li>
          <li>
            Optional: {optionalImportColumns.join(', ')}, and one weight column that names its unit ({weightColumns.join(', ')}).
          </li>
          <li>A row whose tattoo is already in your herd updates that animal (colour, registration, a parent you did not know, a new weight).</li>
        </ul>
        <pre className="overflow-x-auto rounded-lg bg-grey-50 p-3 text-sm">{[requiredImportColumns.join(','), ...example].join('\n')}</pre>
      </div>
    </details>
  );
}
