import { Upload } from 'lucide-react';
import { useId, useRef, useState, type FormEvent } from 'react';
import type { HerdImportDto, HerdImportProgressDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { useStageHerdImport } from '../api/stage-herd-import';

const number = new Intl.NumberFormat('en-US');

function checkingDetail(check: HerdImportProgressDto | null): { value: number | null; detail: string } {
  if (!check) return { value: null, detail: 'Waiting for the upload…' };
  if (check.phase === 'reading') return { value: 0, detail: `Read ${number.format(check.total)} rows` };
  if (check.phase === 'saving') return { value: 1, detail: 'Preparing the preview…' };
  return { value: check.total ? check.done / check.total : null, detail: `${number.format(check.done)} of ${number.format(check.total)} rows` };
}

/**
 * Choose a CSV and send it: a bar for the upload, then one for the server's check of every row
 * (large files take a moment). A refused file says why; the breeder fixes it and chooses it again.
 */
export function ImportUpload({ onStaged, again }: { onStaged: (preview: HerdImportDto) => void; again: boolean }) {
  const stage = useStageHerdImport();
  const [file, setFile] = useState<File | null>(null);
  const [sent, setSent] = useState<number | null>(null);
  const [check, setCheck] = useState<HerdImportProgressDto | null>(null);
  const [missing, setMissing] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const inputId = useId();
  const hintId = useId();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!file) {
      setMissing(true);
      input.current?.focus();
      return;
    }
    setSent(0);
    setCheck(null);
    stage.mutate(
      { file, onUpload: (done, total) => setSent(total > 0 ? done / total : null), onProgress: setCheck },
      {
        onSuccess: (preview) => {
          onStaged(preview);
          setFile(null);
          if (input.current) input.current.value = '';
        },
        onSettled: () => setSent(null),
      },
    );
  };

  const checking = checkingDetail(check);
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Upload a herd spreadsheet">
      <div className="space-y-1.5">
        <label htmlFor={inputId} className="block font-semibold text-bark">
          {again ? 'Choose the fixed file' : 'Spreadsheet (CSV file)'}
        </label>
        <p id={hintId} className="text-sm text-grey-600">
          One animal per line, saved as CSV (UTF-8). Nothing is added to your herd until you confirm.
        </p>
        <input
          ref={input}
          id={inputId}
          type="file"
          accept=".csv,text/csv"
          aria-describedby={hintId}
          aria-invalid={missing || undefined}
          disabled={stage.isPending}
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setMissing(false);
            stage.reset();
          }}
          className="block min-h-11 w-full rounded-lg border-2 border-grey-300 bg-white p-2 file:mr-3 file:min-h-9 file:rounded-md file:border-0 file:bg-moss file:px-3 file:font-semibold file:text-white"
        />
        {missing && <p className="font-semibold text-clay-deep">Choose a CSV file first.</p>}
      </div>
      <Button type="submit" isBusy={stage.isPending}>
        <Upload className="size-5" aria-hidden="true" />
        Upload and check
      </Button>
      {stage.isPending && (
        <div className="space-y-3" aria-live="polite">
          <ProgressBar label="Uploading" value={sent ?? 1} />
          <ProgressBar label="Checking rows" value={sent !== null && sent < 1 ? 0 : checking.value} detail={checking.detail} tone="straw" />
        </div>
      )}
      {stage.isError && (
        <Alert tone="error" title="This file was not accepted">
          <p>{stage.error.message}</p>
          <p className="mt-1">Fix the file and choose it again.</p>
        </Alert>
      )}
    </form>
  );
}
