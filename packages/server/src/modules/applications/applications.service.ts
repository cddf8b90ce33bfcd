import { createHash } from 'node:crypto';
import { ForbiddenError } from '@casl/ability';
import { col, fn, literal, Op, QueryTypes, where, type Order, type Transaction, type WhereOptions } from 'sequelize';
import {
  applicationStatuses,
  defineAbilityFor,
  RealtimeEvent,
  rooms,
  subjectOf,
  type ApplicationApprovalInput,
  type ApplicationDto,
  type ApplicationInput,
  type ApplicationListDto,
  type ApplicationListQuery,
  type ApplicationReceiptDto,
  type ApplicationRejectionInput,
  type ApplicationStatus,
  type ApplicationWithdrawalInput,
  type PublicCoopDto,
} from '@burrowline/shared';
import { accessibleWhere } from '../../db/scope';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { queueMail } from '../../lib/mail-outbox';
import { publish } from '../../lib/realtime';
import { recordAudit } from '../audit/audit.service';
import { hashToken, issueToken } from '../one-time-tokens/one-time-tokens.service';
import { findPublicCoop, getCoop } from '../coops/coops.service';
import { createFarm, findFarmRef, isFarmNameTaken } from '../farms/farms.service';
import { createUser, isEmailRegistered, listAdminContacts, namesOf } from '../users/users.service';
import { ApplicationView } from './application-view.model';
import { Application } from './application.model';
import { applicationApprovedMail, applicationForAccountHolderMail, applicationReceivedMail, applicationRejectedMail, newApplicationMail } from './applications.mail';
import { presentApplication, presentListItem, presentReceipt } from './applications.presenter';

/** What a decision needs besides the actor: where links point, how long they live, the request's address. */
export interface DecisionContext {
  appUrl: string;
  linkTtlHours: number;
  ip: string | null;
}

const slugPattern = /^[a-z0-9]+(-[a-z0-9]+)*$/;

async function publicCoopOrNotFound(slug: string) {
  const coop = slugPattern.test(slug) && slug.length <= 80 ? await findPublicCoop(slug) : null;
  if (!coop) throw AppError.notFound('That co-op');
  return coop;
}

/** The co-op's name and rules for its public application form. */
export async function getPublicCoop(slug: string): Promise<PublicCoopDto> {
  const coop = await publicCoopOrNotFound(slug);
  return { name: coop.name, slug: coop.slug, rulesText: coop.rulesText };
}

function uniqueList<T extends string>(values: T[]): T[] {
  const seen = new Set<string>();
  return values.filter((value) => {
    const key = value.toLowerCase();
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** A stable id in the shape of a random one, so a repeated submit answers the same id. */
function uuidFromKey(key: string): string {
  const hex = createHash('sha256').update(key).digest('hex');
  const variant = ((parseInt(hex[16]!, 16) & 0x3) | 0x8).toString(16);
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-4${hex.slice(13, 16)}-${variant}${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

/**
 * Takes an application from the public form: the one place where the tenant comes from the URL.
 * A repeated submit with the same idempotency key returns the first application (`replayed`).
 * An e-mail that already has an account anywhere gets the usual answer and nothing is stored; its
 * holder is told by e-mail. Refuses an e-mail that already waits here.
 */
export async function submitApplication(
  slug: string,
  input: ApplicationInput,
  ctx: { appUrl: string; ip: string | null },
): Promise<{ receipt: ApplicationReceiptDto; replayed: boolean }> {
  const coop = await publicCoopOrNotFound(slug);
  return withTenant({ coopId: coop.id }, async (tx) => {
    // One submission per e-mail per co-op at a time, so the checks below cannot race each other.
    await database().query('SELECT pg_advisory_xact_lock(hashtext($1))', {
      bind: [`application:${coop.id}:${input.email}`],
      transaction: tx,
    });
    const earlier = await Application.findOne({ where: { coopId: coop.id, idempotencyKey: input.idempotencyKey }, transaction: tx });
    if (earlier) {
      if (earlier.email !== input.email) {
        throw AppError.conflict('This form was already sent with other details. Reload the page to start a new application.');
      }
      return { receipt: presentReceipt(earlier, coop.name), replayed: true };
    }
    if (await isEmailRegistered(input.email, tx)) {
      // Answered like a new application, so the form does not tell who has an account; the holder is told by e-mail.
      const mail = applicationForAccountHolderMail({ to: input.email, coopName: coop.name, signInUrl: `${ctx.appUrl}/sign-in` });
      const queued = await queueMail(tx, `application-by-account-holder:${hashToken(`${input.idempotencyKey}:${input.email}`)}`, mail);
      const receipt: ApplicationReceiptDto = {
        id: uuidFromKey(`${coop.id}:${input.idempotencyKey}`),
        status: 'pending',
        email: input.email,
        farmName: input.farmName,
        coopName: coop.name,
        submittedAt: new Date().toISOString(),
      };
      return { receipt, replayed: !queued };
    }
    if (await findPendingApplicationId(coop.id, input.email, tx)) {
      const message = 'An application from this e-mail address is already waiting for the coordinator. You will hear back by e-mail.';
      throw AppError.conflict(message, { email: [message] });
    }

    const diseased = input.diseaseLastYear === 'yes';
    const application = await Application.create(
      {
        coopId: coop.id,
        idempotencyKey: input.idempotencyKey,
        applicantName: input.applicantName,
        email: input.email,
        phone: input.phone,
        farmName: input.farmName,
        location: input.location,
        timeZone: input.timeZone,
        breedsKept: uniqueList(input.breedsKept),
        does: input.does,
        bucks: input.bucks,
        quarantinePractice: input.quarantinePractice,
        diseaseLastYear: diseased,
        diseaseDetails: diseased ? input.diseaseDetails : '',
        sharing: uniqueList(input.sharing),
        sharingNotes: input.sharingNotes,
        // The rules as the applicant saw them, from the co-op, never from the request.
        rulesTextAgreed: coop.rulesText,
        rulesAgreedAt: new Date(),
      },
      { transaction: tx },
    );
    await recordAudit(
      {
        coopId: coop.id,
        actorUserId: null,
        action: 'application.submitted',
        subjectType: 'Application',
        subjectId: application.id,
        details: { applicantName: application.applicantName, farmName: application.farmName },
        ip: ctx.ip,
      },
      tx,
    );
    const admins = await listAdminContacts(coop.id, tx);
    const received = applicationReceivedMail({ to: application.email, name: application.applicantName, coopName: coop.name, farmName: application.farmName });
    const notices = admins.map((admin) => ({
      adminId: admin.id,
      mail: newApplicationMail({
        to: admin.email,
        adminName: admin.name,
        coopName: coop.name,
        applicantName: application.applicantName,
        farmName: application.farmName,
        location: application.location,
        herdSize: application.does + application.bucks,
        diseaseLastYear: application.diseaseLastYear,
        sharing: application.sharing,
        url: `${ctx.appUrl}/admin/applications/${application.id}`,
      }),
    }));
    await queueMail(tx, `application-received:${application.id}`, received);
    for (const notice of notices) await queueMail(tx, `application-new-notice:${application.id}:${notice.adminId}`, notice.mail);
    tx.afterCommit(() => publish(rooms.coopAdmins(coop.id), RealtimeEvent.applicationCreated, { applicationId: application.id }));
    return { receipt: presentReceipt(application, coop.name), replayed: false };
  });
}

/** Applications are the admin's alone: anyone else is refused before anything is looked up. */
function assertReviewer(actor: SessionUser) {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('manage', subjectOf('Application', { coopId: actor.coopId }));
}

async function findForReviewer(actor: SessionUser, applicationId: string, tx: Transaction, opts: { lock?: boolean } = {}) {
  assertReviewer(actor);
  const application = await Application.findOne({
    where: { id: applicationId, coopId: actor.coopId },
    transaction: tx,
    lock: opts.lock ? tx.LOCK.UPDATE : undefined,
  });
  if (!application) throw AppError.notFound('That application');
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('manage', subjectOf('Application', { coopId: application.coopId }));
  return application;
}

async function viewedBy(userId: string, applicationIds: string[], tx: Transaction): Promise<Set<string>> {
  if (applicationIds.length === 0) return new Set();
  const views = await ApplicationView.findAll({
    where: { userId, applicationId: { [Op.in]: applicationIds } },
    attributes: ['applicationId'],
    transaction: tx,
  });
  return new Set(views.map((v) => v.applicationId));
}

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

function orderFor(query: ApplicationListQuery): Order {
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  const primary = query.sort === 'herdSize' ? [literal('(does + bucks)'), dir] : [query.sort, dir];
  return [primary, ['createdAt', dir], ['id', 'ASC']] as Order;
}

/** The admin's queue: filtered by status, searched, sorted and paged on the server. */
export async function listApplications(actor: SessionUser, query: ApplicationListQuery): Promise<ApplicationListDto> {
  assertReviewer(actor);
  const ability = defineAbilityFor(actor);
  return withTenant(actor, async (tx) => {
    const scope = accessibleWhere(ability, 'manage', 'Application');
    const conditions: WhereOptions[] = [scope];
    if (query.status !== 'all') conditions.push({ status: query.status });
    if (query.q) {
      const like = `%${escapeLike(query.q)}%`;
      conditions.push({ [Op.or]: ['applicantName', 'email', 'farmName', 'location'].map((field) => ({ [field]: { [Op.iLike]: like } })) });
    }
    const { rows, count } = await Application.findAndCountAll({
      where: { [Op.and]: conditions },
      order: orderFor(query),
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
      transaction: tx,
    });
    const viewed = await viewedBy(actor.id, rows.map((r) => r.id), tx);
    const perStatus = (await Application.findAll({
      where: scope,
      attributes: ['status', [fn('count', col('id')), 'n']],
      group: ['status'],
      raw: true,
      transaction: tx,
    })) as unknown as { status: ApplicationStatus; n: string }[];
    const counts = Object.fromEntries(applicationStatuses.map((s) => [s, 0])) as Record<ApplicationStatus, number>;
    for (const row of perStatus) counts[row.status] = Number(row.n);
    return {
      items: rows.map((row) => presentListItem(row, !viewed.has(row.id))),
      total: count,
      page: query.page,
      pageSize: query.pageSize,
      counts,
    };
  });
}

/** Pending applications this admin has not opened yet: the badge in the navigation. */
export async function countUnreadApplications(actor: SessionUser): Promise<number> {
  assertReviewer(actor);
  return withTenant(actor, async (tx) => {
    const [row] = await database().query<{ n: number }>(
      `SELECT count(*)::int AS n FROM applications a
       WHERE a.coop_id = $1 AND a.status = 'pending'
         AND NOT EXISTS (SELECT 1 FROM application_views v WHERE v.application_id = a.id AND v.user_id = $2)`,
      { bind: [actor.coopId, actor.id], type: QueryTypes.SELECT, transaction: tx },
    );
    return row?.n ?? 0;
  });
}

async function present(application: Application, actor: SessionUser, tx: Transaction): Promise<ApplicationDto> {
  // One connection per transaction: the queries run one after another anyway.
  const names = await namesOf([application.reviewedByUserId, application.userId], tx);
  const viewed = await viewedBy(actor.id, [application.id], tx);
  const farm = application.farmId ? await findFarmRef(actor.coopId, application.farmId, tx) : null;
  return presentApplication(application, { isNew: !viewed.has(application.id), names, farmName: farm?.name ?? null });
}

/** Everything the applicant wrote, and the decision once made. Another co-op's application is 404. */
export async function getApplication(actor: SessionUser, applicationId: string): Promise<ApplicationDto> {
  return withTenant(actor, async (tx) => present(await findForReviewer(actor, applicationId, tx), actor, tx));
}

/** The admin has opened it: it no longer counts as new for them (other admins still see it as new). */
export async function markApplicationViewed(actor: SessionUser, applicationId: string): Promise<void> {
  await withTenant(actor, async (tx) => {
    await findForReviewer(actor, applicationId, tx);
    await ApplicationView.bulkCreate([{ applicationId, userId: actor.id, coopId: actor.coopId }], { ignoreDuplicates: true, transaction: tx });
  });
}

async function alreadyDecided(actor: SessionUser, application: Application, tx: Transaction): Promise<AppError> {
  const names = await namesOf([application.reviewedByUserId], tx);
  const who =
    application.reviewedByUserId === actor.id ? 'You' : (application.reviewedByUserId && names.get(application.reviewedByUserId)) || 'Another admin';
  const decided: Record<ApplicationStatus, string> = { pending: 'reviewed', approved: 'approved', rejected: 'rejected', withdrawn: 'marked as withdrawn' };
  const what = decided[application.status as ApplicationStatus];
  return AppError.conflict(`${who} already ${what} this application. Nothing was changed; reload to see the decision.`);
}

/**
 * The frame of every decision: the application row is locked, so of two admins deciding at once the
 * second waits, then finds it decided and gets a clear conflict instead of a second decision.
 */
async function decide(
  actor: SessionUser,
  applicationId: string,
  work: (application: Application, tx: Transaction) => Promise<void>,
): Promise<ApplicationDto> {
  return withTenant(actor, async (tx) => {
    const application = await findForReviewer(actor, applicationId, tx, { lock: true });
    if (application.status !== 'pending') throw await alreadyDecided(actor, application, tx);
    await work(application, tx);
    tx.afterCommit(() =>
      publish(rooms.coopAdmins(actor.coopId), RealtimeEvent.applicationUpdated, { applicationId: application.id, status: application.status }),
    );
    return present(application, actor, tx);
  });
}

async function coopNameOf(coopId: string, tx: Transaction): Promise<string> {
  return (await getCoop(coopId, tx))?.name ?? 'the co-op';
}

/**
 * Admits the applicant, in one transaction: their account (a member, no password yet) and their
 * farm (profile from the application), the application marked approved with who and when, and a
 * single-use set-password link e-mailed (queued in the same transaction). The new farm is announced
 * to the co-op live.
 */
export async function approveApplication(
  actor: SessionUser,
  applicationId: string,
  input: ApplicationApprovalInput,
  ctx: DecisionContext,
): Promise<ApplicationDto> {
  return decide(actor, applicationId, async (application, tx) => {
    const farmName = input.farmName ?? application.farmName;
    if (await isEmailRegistered(application.email, tx)) {
      throw AppError.conflict('Since this application arrived, its e-mail address has been given to another account. Reject or withdraw the application instead.');
    }
    if (await isFarmNameTaken(actor.coopId, farmName, tx)) {
      const message = `A farm called "${farmName}" is already in the co-op. Approve with another farm name.`;
      throw AppError.conflict(message, { farmName: [message] });
    }
    const farm = await createFarm(
      actor.coopId,
      {
        name: farmName,
        location: application.location,
        timeZone: application.timeZone,
        weightUnit: 'lb_oz',
        temperatureUnit: 'F',
        breedsKept: application.breedsKept,
        description: '',
      },
      tx,
    );
    const user = await createUser(
      { coopId: actor.coopId, farmId: farm.id, email: application.email, name: application.applicantName, role: 'member', passwordHash: null },
      tx,
    );
    application.set({ status: 'approved', reviewedByUserId: actor.id, reviewedAt: new Date(), userId: user.id, farmId: farm.id });
    await application.save({ transaction: tx });
    const token = await issueToken({ userId: user.id, coopId: actor.coopId, purpose: 'set_password', ttlMinutes: ctx.linkTtlHours * 60 }, tx);
    await recordAudit(
      {
        coopId: actor.coopId,
        actorUserId: actor.id,
        action: 'application.approved',
        subjectType: 'Application',
        subjectId: application.id,
        details: { applicantName: application.applicantName, farmName: farm.name, userId: user.id, farmId: farm.id },
        ip: ctx.ip,
      },
      tx,
    );
    const mail = applicationApprovedMail({
      to: user.email,
      name: user.name,
      coopName: await coopNameOf(actor.coopId, tx),
      farmName: farm.name,
      url: `${ctx.appUrl}/set-password?token=${token}`,
      ttlHours: ctx.linkTtlHours,
    });
    await queueMail(tx, `application-approved:${application.id}`, mail);
    tx.afterCommit(() => {
      publish(rooms.coop(actor.coopId), RealtimeEvent.farmCreated, { farmId: farm.id });
      publish(rooms.coopAdmins(actor.coopId), RealtimeEvent.memberUpdated, { userId: user.id });
    });
  });
}

/** Turns the application down; the reason is kept and e-mailed to the applicant (queued in the same transaction). */
export async function rejectApplication(
  actor: SessionUser,
  applicationId: string,
  input: ApplicationRejectionInput,
  ctx: DecisionContext,
): Promise<ApplicationDto> {
  return decide(actor, applicationId, async (application, tx) => {
    application.set({ status: 'rejected', reviewedByUserId: actor.id, reviewedAt: new Date(), decisionNote: input.reason });
    await application.save({ transaction: tx });
    await recordAudit(
      {
        coopId: actor.coopId,
        actorUserId: actor.id,
        action: 'application.rejected',
        subjectType: 'Application',
        subjectId: application.id,
        details: { applicantName: application.applicantName, farmName: application.farmName, reason: input.reason },
        ip: ctx.ip,
      },
      tx,
    );
    const mail = applicationRejectedMail({
      to: application.email,
      name: application.applicantName,
      coopName: await coopNameOf(actor.coopId, tx),
      reason: input.reason,
    });
    await queueMail(tx, `application-rejected:${application.id}`, mail);
  });
}

/** The applicant told the co-op they no longer want to join; recorded, not e-mailed. */
export async function withdrawApplication(
  actor: SessionUser,
  applicationId: string,
  input: ApplicationWithdrawalInput,
  ctx: DecisionContext,
): Promise<ApplicationDto> {
  return decide(actor, applicationId, async (application, tx) => {
    application.set({ status: 'withdrawn', reviewedByUserId: actor.id, reviewedAt: new Date(), decisionNote: input.note || null });
    await application.save({ transaction: tx });
    await recordAudit(
      {
        coopId: actor.coopId,
        actorUserId: actor.id,
        action: 'application.withdrawn',
        subjectType: 'Application',
        subjectId: application.id,
        details: { applicantName: application.applicantName, farmName: application.farmName, note: input.note ?? '' },
        ip: ctx.ip,
      },
      tx,
    );
  });
}

/** A pending application from this e-mail, if any (so an invitation can point the admin to it). */
export async function findPendingApplicationId(coopId: string, email: string, tx: Transaction): Promise<string | null> {
  const application = await Application.findOne({
    where: { coopId, status: 'pending', [Op.and]: [where(fn('lower', col('email')), email.trim().toLowerCase())] },
    attributes: ['id'],
    transaction: tx,
  });
  return application?.id ?? null;
}
