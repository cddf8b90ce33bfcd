import { composeMail } from '../../lib/mailer';

export function invitationMail(opts: {
  to: string;
  name: string;
  inviterName: string;
  coopName: string;
  farmName: string;
  joinsExistingFarm: boolean;
  url: string;
  ttlHours: number;
}) {
  return composeMail({
    to: opts.to,
    subject: `${opts.inviterName} invited you to ${opts.coopName}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `${opts.inviterName} has invited you to join ${opts.coopName} on Burrowline, the co-op's shared workspace.`,
      opts.joinsExistingFarm
        ? `You will join ${opts.farmName}, which is already in the co-op.`
        : `Your farm, ${opts.farmName}, is added to the co-op's directory as soon as you set your password.`,
      `Choose a password with the button below, then sign in. The link works once and expires in ${opts.ttlHours} hours; if it has expired, ask ${opts.inviterName} for a new one.`,
    ],
    action: { label: 'Accept and set your password', url: opts.url },
  });
}

/** A new link for someone admitted who has not set a password yet (the first one expired or got lost). */
export function setPasswordLinkMail(opts: { to: string; name: string; coopName: string; url: string; ttlHours: number }) {
  return composeMail({
    to: opts.to,
    subject: `Your link to sign in to ${opts.coopName}`,
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      `Here is a new link to set your Burrowline password for ${opts.coopName}. Any earlier link no longer works.`,
      `It works once and expires in ${opts.ttlHours} hours.`,
    ],
    action: { label: 'Set your password', url: opts.url },
  });
}

/** To the holder of an address an admin of another co-op invited: the admin was answered as usual. */
export function invitationForAccountHolderMail(opts: { to: string; inviterName: string; coopName: string; signInUrl: string }) {
  return composeMail({
    to: opts.to,
    subject: `${opts.inviterName} tried to invite you to ${opts.coopName}`,
    greeting: 'Hello,',
    paragraphs: [
      `${opts.inviterName} tried to invite this e-mail address to ${opts.coopName} on Burrowline. It already has a Burrowline account, so no invitation was made and ${opts.coopName} was not told about your account.`,
      `If you want to join ${opts.coopName} as well, ask ${opts.inviterName} to invite another address of yours. Otherwise there is nothing to do; your account is unchanged.`,
    ],
    action: { label: 'Sign in to your account', url: opts.signInUrl },
  });
}
