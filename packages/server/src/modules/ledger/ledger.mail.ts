import { composeMail } from '../../lib/mailer';

export function duesReminderMail(opts: { to: string; name: string; coopName: string; farmName: string; year: number; owed: string; dueOn: string; url: string }) {
  return composeMail({
    to: opts.to,
    subject: `${opts.coopName}: ${opts.year} dues of ${opts.owed} are due on ${opts.dueOn}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `${opts.farmName} still owes ${opts.owed} of the co-op's ${opts.year} dues, due on ${opts.dueOn}.`,
      'You can pay by card in the Ledger, or record a payment made another way for the co-op\'s admin to confirm. If you have just paid, thank you: the Ledger shows it once it is confirmed.',
    ],
    action: { label: 'Open the Ledger', url: opts.url },
  });
}
