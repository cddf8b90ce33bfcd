import { SWAP_MEAT_CAUTION } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';

/** Shown on grow-out (fryer) listings: selling meat and live animals for meat follows state and local rules. */
export function MeatCaution({ text = SWAP_MEAT_CAUTION }: { text?: string | null }) {
  if (!text) return null;
  return (
    <Alert tone="warning" title="Selling meat and live animals for meat">
      {text}
    </Alert>
  );
}
