interface MaildevMessage {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string; name?: string }[];
  headers: Record<string, string>;
}

const api = () => {
  const url = process.env.MAILDEV_API;
  if (!url) throw new Error('MAILDEV_API is not set: run the tests with npm test');
  return url;
};

/**
 * Waits for the mail to a unique recipient to reach maildev (never clears the shared inbox). `inbox` is
 * another maildev's web address, for a test that runs a mail server of its own.
 */
export async function waitForMail(to: string, opts: { subject?: RegExp; timeoutMs?: number; inbox?: string } = {}): Promise<MaildevMessage> {
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  while (Date.now() < deadline) {
    const res = await fetch(`${opts.inbox ?? api()}/api/email`);
    const all = (await res.json()) as MaildevMessage[];
    const found = all.filter(
      (m) => m.to.some((r) => r.address.toLowerCase() === to.toLowerCase()) && (!opts.subject || opts.subject.test(m.subject)),
    );
    if (found.length) return found.at(-1)!;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no e-mail to ${to}${opts.subject ? ` matching ${opts.subject}` : ''} arrived`);
}

export async function mailsTo(to: string, inbox = api()): Promise<MaildevMessage[]> {
  const res = await fetch(`${inbox}/api/email`);
  const all = (await res.json()) as MaildevMessage[];
  return all.filter((m) => m.to.some((r) => r.address.toLowerCase() === to.toLowerCase()));
}

export function linkIn(message: MaildevMessage, pathPrefix: string): URL {
  const match = message.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/[/?]/g, '\\$&')}[^\\s]*`));
  if (!match) throw new Error(`no ${pathPrefix} link in the e-mail`);
  return new URL(match[0]);
}
