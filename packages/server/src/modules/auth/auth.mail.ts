import { composeMail } from '../../lib/mailer';

export function passwordResetMail(opts: { to: string; name: string; url: string; ttlMinutes: number }) {
  return composeMail({
    to: opts.to,
    subject: 'Reset your Burrowline password',
    greeting: `Hello ${opts.name},`,
    paragraphs: [
      'Someone asked to reset the password of your Burrowline account. If it was you, choose a new password with the button below.',
      `The link works once and expires in ${opts.ttlMinutes} minutes. If you did not ask for it, ignore this e-mail; your password stays as it is.`,
    ],
    action: { label: 'Choose a new password', url: opts.url },
  });
}
