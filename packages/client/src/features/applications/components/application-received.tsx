import { CircleCheck } from 'lucide-react';
import type { ApplicationReceiptDto } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';

/** What the applicant sees once the form is in: what happens next, and where the answer will come. */
export function ApplicationReceived({ receipt }: { receipt: ApplicationReceiptDto }) {
  return (
    <Card className="space-y-4" role="status">
      <h2 className="flex items-center gap-2 text-2xl font-bold">
        <CircleCheck className="size-7 text-moss" aria-hidden="true" />
        Application sent
      </h2>
      <p>
        Thank you. {receipt.coopName}'s coordinator has your application for <strong>{receipt.farmName}</strong> and will
        write to <strong>{receipt.email}</strong> once it is decided. A confirmation is on its way there now.
      </p>
      <p className="text-grey-600">
        If you are admitted, that e-mail carries a link to set your password and sign in. Nothing there? Look in your spam folder.
      </p>
    </Card>
  );
}
