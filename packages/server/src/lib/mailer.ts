import { createHash } from 'node:crypto';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config/env';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

let transport: Transporter | null = null;
let from = 'Burrowline <no-reply@burrowline.test>';

export function configureMailer(smtp: Config['smtp']) {
  from = smtp.from;
  transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: !smtp.secure && (smtp.host === '127.0.0.1' || smtp.host === 'localhost'),
    auth: smtp.user ? { user: smtp.user, pass: smtp.pass } : undefined,
    // The outbox worker holds the message's row locked while it talks to the server: do not hang for minutes.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
}

/** A Message-ID that is the same on every try of one e-mail, so a receiver can drop a rare duplicate. */
export function messageIdFor(key: string): string {
  const domain = /@([^>\s]+)/.exec(from)?.[1] ?? 'burrowline.invalid';
  return `<${createHash('sha256').update(key).digest('hex').slice(0, 40)}@${domain}>`;
}

/** ASVS 1.3.11: header values never carry CR/LF from user input. */
export function headerSafe(value: string): string {
  return value.replace(/[\r\n]+/g, ' ').trim();
}

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/**
 * Hands one message to the mail server and throws when it is not accepted. Only the outbox worker
 * calls this: product code queues mail with `queueMail` in its transaction.
 */
export async function transmitMail(message: MailMessage, opts: { messageId: string }): Promise<void> {
  if (!transport) throw new Error('no mail server configured');
  await transport.sendMail({
    from,
    to: headerSafe(message.to),
    subject: headerSafe(message.subject),
    text: message.text,
    html: message.html,
    messageId: opts.messageId,
  });
}

/** The shared frame of every e-mail: plain text and HTML parts from the same content. */
export function composeMail(opts: { to: string; subject: string; greeting: string; paragraphs: string[]; action?: { label: string; url: string }; footer?: string }): MailMessage {
  const footer = opts.footer ?? 'Burrowline — the co-op workspace for meat-rabbit breeders.';
  const textParts = [opts.greeting, '', ...opts.paragraphs.flatMap((p) => [p, ''])];
  if (opts.action) textParts.push(`${opts.action.label}: ${opts.action.url}`, '');
  textParts.push('—', footer);
  const htmlAction = opts.action
    ? `<p><a href="${escapeHtml(opts.action.url)}" style="display:inline-block;padding:12px 20px;background:#2F5D50;color:#fff;border-radius:8px;text-decoration:none">${escapeHtml(opts.action.label)}</a></p><p style="font-size:12px;color:#6b625d">Or paste this address into your browser: ${escapeHtml(opts.action.url)}</p>`
    : '';
  const html = `<!doctype html><html><body style="font-family:Lexend,Arial,sans-serif;background:#F7F3EA;color:#3B2F2A;padding:24px">
<div style="max-width:560px;margin:auto;background:#fff;border-radius:12px;padding:24px">
<p>${escapeHtml(opts.greeting)}</p>${opts.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('')}${htmlAction}
<hr style="border:none;border-top:1px solid #e5e0d6"><p style="font-size:12px;color:#6b625d">${escapeHtml(footer)}</p></div></body></html>`;
  return { to: opts.to, subject: opts.subject, text: textParts.join('\n'), html };
}
