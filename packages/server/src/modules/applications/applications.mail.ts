import { composeMail } from '../../lib/mailer';

const sharingWords: Record<string, string> = { bucks: 'stud bucks', processing_days: 'processing days', trades: 'trades' };

export function applicationReceivedMail(opts: { to: string; name: string; coopName: string; farmName: string }) {
  return composeMail({
    to: opts.to,
    subject: `We received your application to ${opts.coopName}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `Thank you for applying to join ${opts.coopName} with ${opts.farmName}. The co-op's coordinator reads every application and will write to you at this address once it is decided.`,
      'New members bring animals, and with them disease risk, so the coordinator may get in touch to ask about your herd and how you keep new stock apart first.',
      'Until then, keep any animals you plan to bring isolated as usual; 30 days is a common recommendation for new or returning rabbits.',
    ],
  });
}

export function newApplicationMail(opts: {
  to: string;
  adminName: string;
  coopName: string;
  applicantName: string;
  farmName: string;
  location: string;
  herdSize: number;
  diseaseLastYear: boolean;
  sharing: string[];
  url: string;
}) {
  const shares = opts.sharing.map((s) => sharingWords[s] ?? s);
  return composeMail({
    to: opts.to,
    subject: `New application: ${opts.applicantName} (${opts.farmName})`,
    greeting: `Hello ${opts.adminName},`,
    paragraphs: [
      `${opts.applicantName} of ${opts.farmName} (${opts.location}) has applied to join ${opts.coopName}.`,
      `Herd: ${opts.herdSize} breeding ${opts.herdSize === 1 ? 'animal' : 'animals'}. Disease in the herd in the last year: ${opts.diseaseLastYear ? 'yes — read the details before deciding' : 'no'}.` +
        (shares.length ? ` Hopes to share: ${shares.join(', ')}.` : ''),
      'Everything they wrote is in the queue.',
    ],
    action: { label: 'Review the application', url: opts.url },
  });
}

export function applicationApprovedMail(opts: { to: string; name: string; coopName: string; farmName: string; url: string; ttlHours: number }) {
  return composeMail({
    to: opts.to,
    subject: `Welcome to ${opts.coopName}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `Your application to join ${opts.coopName} has been approved. ${opts.farmName} is now in the co-op's directory.`,
      'Choose a password with the button below, then sign in. You will find your farm and the other members on Commons.',
      `The link works once and expires in ${opts.ttlHours} hours. If it has expired, use "Forgot your password?" on the sign-in page to get a new one.`,
      'Before any animal of yours meets the co-op\'s, isolate new or returning stock for the quarantine period in the co-op rules.',
    ],
    action: { label: 'Set your password', url: opts.url },
  });
}

export function applicationRejectedMail(opts: { to: string; name: string; coopName: string; reason: string }) {
  return composeMail({
    to: opts.to,
    subject: `Your application to ${opts.coopName}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `Thank you for applying to join ${opts.coopName}. The coordinator has decided not to admit you at this time.`,
      `Their reason: ${opts.reason}`,
      'You are welcome to apply again later if things change.',
    ],
  });
}

/** To the holder of an address someone applied with: the form answered as usual and told them nothing. */
export function applicationForAccountHolderMail(opts: { to: string; coopName: string; signInUrl: string }) {
  return composeMail({
    to: opts.to,
    subject: `An application to ${opts.coopName} used your e-mail address`,
    greeting: 'Hello,',
    paragraphs: [
      `Someone applied to join ${opts.coopName} on Burrowline with this e-mail address, which already has a Burrowline account. No application was made with it.`,
      'If it was you: sign in with your account instead. If you forgot your password, "Forgot your password?" on the sign-in page sends you a link. To join another co-op with a farm of its own, apply with a different address.',
      'If it was not you, there is nothing to do; your account is unchanged.',
    ],
    action: { label: 'Sign in', url: opts.signInUrl },
  });
}
