import { packRules } from '@casl/ability/extra';
import { defineAbilityFor, ErrorCode, rooms, type MeDto } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJob, handleJobs, queueMail } from '../../lib/mail-outbox';
import { assertPasswordAllowed, hashPassword } from '../../lib/passwords';
import { disconnectRoom } from '../../lib/realtime';
import { findIdentityByEmail } from '../../http/passport';
import type { SessionUser } from '../../lib/session-user';
import { recordAudit } from '../audit/audit.service';
import { getCoop } from '../coops/coops.service';
import { acceptPendingInvitation } from '../members/members.service';
import { findUser, replacePassword } from '../users/users.service';
import { passwordResetMail } from './auth.mail';
import { consumeToken, hashToken, issueToken, peekToken } from '../one-time-tokens/one-time-tokens.service';

/** The signed-in person and their co-op, as `/api/me` and sign-in answer. */
export async function describeMe(actor: SessionUser): Promise<MeDto> {
  const coop = await withTenant(actor, (tx) => getCoop(actor.coopId, tx));
  if (!coop) throw AppError.notFound('Your co-op');
  return {
    user: { id: actor.id, email: actor.email, name: actor.name, role: actor.role, farmId: actor.farmId, mentorId: actor.mentorId },
    coop: { id: coop.id, name: coop.name, slug: coop.slug, currency: coop.currency, quarantineDays: coop.quarantineDays },
    rules: packRules(defineAbilityFor(actor).rules),
  };
}

/** The queue of reset requests (migration 0034): the link is made and mailed after the answer. */
export const PASSWORD_RESET_QUEUE = 'password-reset-requests';

interface ResetRequest {
  email: string;
  ip: string | null;
  appUrl: string;
  ttlMinutes: number;
}

/**
 * Takes a reset request: only queues it, so the answer and its timing are the same whether or not the
 * e-mail belongs to an account; the job looks the address up and mails the link.
 */
export async function requestPasswordReset(input: { email: string; ip: string | null }, opts: { appUrl: string; ttlMinutes: number }) {
  const request: ResetRequest = { email: input.email, ip: input.ip, appUrl: opts.appUrl, ttlMinutes: opts.ttlMinutes };
  await enqueueJob(PASSWORD_RESET_QUEUE, request);
}

/** Sends a reset link when the e-mail belongs to an active account; any other address gets nothing. */
export async function sendPasswordReset(request: ResetRequest): Promise<void> {
  const identity = await findIdentityByEmail(request.email);
  if (!identity || identity.disabled_at) {
    await recordAudit({ coopId: null, actorUserId: null, action: 'password_reset.unknown_email', ip: request.ip });
    return;
  }
  await withTenant({ coopId: identity.coop_id }, async (tx) => {
    const user = await findUser(identity.id, tx);
    if (!user) return;
    const token = await issueToken({ userId: user.id, coopId: user.coopId, purpose: 'reset_password', ttlMinutes: request.ttlMinutes }, tx);
    await recordAudit({ coopId: user.coopId, actorUserId: user.id, action: 'password_reset.requested', ip: request.ip }, tx);
    const mail = passwordResetMail({ to: user.email, name: user.name, url: `${request.appUrl}/set-password?token=${token}`, ttlMinutes: request.ttlMinutes });
    await queueMail(tx, `password-reset:${user.id}:${hashToken(token)}`, mail);
  });
}

handleJobs<ResetRequest>(PASSWORD_RESET_QUEUE, sendPasswordReset);

/**
 * Sets a password from a single-use link (reset, or a new member's first password). Every other
 * session of the account ends.
 */
export async function setPasswordWithToken(input: { token: string; password: string; ip: string | null }): Promise<{ email: string }> {
  const invalid = new AppError(ErrorCode.invalidToken, 400, 'This link has expired or was already used. Ask for a new one.');
  const peeked = await peekToken(input.token);
  if (!peeked) throw invalid;
  const passwordHash = await (async () => {
    const user = await withTenant({ coopId: peeked.coopId }, (tx) => findUser(peeked.userId, tx));
    if (!user) throw invalid;
    assertPasswordAllowed(input.password, [user.email.split('@')[0] ?? '', user.name]);
    return hashPassword(input.password);
  })();
  return withTenant({ coopId: peeked.coopId }, async (tx) => {
    if (!(await consumeToken(input.token, tx))) throw invalid;
    const user = await findUser(peeked.userId, tx, { lock: true });
    if (!user || user.disabledAt) throw invalid;
    await replacePassword(user, passwordHash, tx);
    // An invitee's farm is created (or joined) the moment they accept by setting a password.
    await acceptPendingInvitation(user, tx, { ip: input.ip });
    await recordAudit({ coopId: user.coopId, actorUserId: user.id, action: 'password.set', details: { via: peeked.purpose }, ip: input.ip }, tx);
    tx.afterCommit(() => disconnectRoom(rooms.user(user.id), 'password_changed'));
    return { email: user.email };
  });
}
