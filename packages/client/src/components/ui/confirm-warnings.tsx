import { Alert } from './alert';
import { Button } from './button';

interface ConfirmWarningsProps {
  /** From `useServerSubmit`: the server's warnings, or null when there are none. */
  warnings: string[] | null;
  onConfirm: () => void;
  isBusy?: boolean;
  title?: string;
}

/** Warnings the breeder may override: shown above the form's button, with "Save anyway". */
export function ConfirmWarnings({ warnings, onConfirm, isBusy, title = 'Check before saving' }: ConfirmWarningsProps) {
  if (!warnings) return null;
  return (
    <Alert
      tone="warning"
      title={title}
      actions={
        <Button onClick={onConfirm} isBusy={isBusy}>
          Save anyway
        </Button>
      }
    >
      {warnings.length === 1 ? (
        warnings[0]
      ) : (
        <ul className="list-disc space-y-1 pl-5">
          {warnings.map((warning) => (
            <li key={warning}>{warning}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
