import { ForbiddenError } from '@casl/ability';
import { col, fn, Op, QueryTypes, where, type Transaction } from 'sequelize';
import {
  defineAbilityFor,
  ErrorCode,
  RealtimeEvent,
  rooms,
  subjectOf,
  type InvitationInput,
  type MemberDisableInput,
  type MemberDto,
  type MemberEnableInput,
  type MemberListDto,
  type MemberListView,
  type MemberRoleChangeInput,
} from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { queueMail } from '../../lib/mail-outbox';
import { disconnectRoom, publish } from '../../lib/realtime';
import { revokeFeedsNoLongerAllowed } from '../almanac/calendar-feed.service';
import { findPendingApplicationId } from '../applications/applications.service';
import { lastSignIns, recordAudit } from '../audit/audit.service';
import { hashToken, issueToken } from '../one-time-tokens/one-time-tokens.service';
import { getCoop } from '../coops/coops.service';
import { createFarm, findFarmRef, findFarmRefs, isFarmNameTaken } from '../farms/farms.service';
import { DEFAULT_FARM_TIME_ZONE } from '../farms/farm-clock';
import {
  attachToFarm,
  createUser,
  disableUser,
  enableUser,
  findUser,
  findUserByEmail,
  isEmailRegistered,
  usersInOrder,
  namesOf,
  reviveInvitee,
  setRole,
  unsavedUser,
  type UserRecord,
} from '../users/users.service';
import { Invitation } from './invitation.model';
import { invitationForAccountHolderMail, invitationMail, setPasswordLinkMail } from './members.mail';
import { membersPageSql } from './members-page';
import { presentMember } from './members.presenter';

/** Where set-password links point, how long they live, and the request's address for the audit log. */
export interface MemberLinkContext {
  appUrl: string;
  linkTtlHours: number;
  ip: string | null;
}

const INVITATION_WITHDRAWN = 'Invitation withdrawn';

function assertRosterManager(actor: SessionUser) {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('manage', subjectOf('Membership', { coopId: actor.coopId }));
}

/** A person of the actor's co-op, locked for a change; another co-op's person is not there (404). */
async function lockMember(actor: SessionUser, userId: string, tx: Transaction): Promise<UserRecord> {
  assertRosterManager(actor);
  const user = await findUser(userId, tx, { lock: true });
  if (!user || user.coopId !== actor.coopId) throw AppError.notFound('That member');
  return user;
}

function assertNotSelf(actor: SessionUser, user: UserRecord, what: string) {
  if (user.id === actor.id) throw new AppError(ErrorCode.forbidden, 403, `You cannot ${what} yourself; ask another admin of the co-op.`);
}

function assertVersion(user: UserRecord, version: number) {
  if (user.version !== version) throw AppError.staleVersion();
}

async function pendingInvitations(coopId: string, userIds: string[] | null, tx: Transaction): Promise<Map<string, Invitation>> {
  const invitations = await Invitation.findAll({
    where: { coopId, status: 'pending', ...(userIds ? { userId: { [Op.in]: userIds } } : {}) },
    transaction: tx,
  });
  return new Map(invitations.map((i) => [i.userId, i]));
}

/** Presents people with everything the roster shows, in a fixed number of queries. */
async function presentMembers(coopId: string, users: UserRecord[], tx: Transaction, scope: 'all' | 'these'): Promise<MemberDto[]> {
  const ids = users.map((u) => u.id);
  const invitations = await pendingInvitations(coopId, scope === 'all' ? null : ids, tx);
  const signIns = await lastSignIns(coopId, tx, scope === 'all' ? undefined : ids);
  const names = await namesOf([...users.map((u) => u.mentorId), ...[...invitations.values()].map((i) => i.invitedByUserId)], tx);
  const farmIds = new Set([...users.map((u) => u.farmId), ...[...invitations.values()].map((i) => i.farmId)].filter((id): id is string => Boolean(id)));
  const farms = await findFarmRefs(coopId, [...farmIds], tx);
  const farmNames = new Map([...farms.values()].map((farm) => [farm.id, farm.name]));
  return users.map((user) =>
    presentMember(user, { invitation: invitations.get(user.id) ?? null, names, farmNames, lastSignInAt: signIns.get(user.id) ?? null }),
  );
}

async function presentOne(coopId: string, user: UserRecord, tx: Transaction): Promise<MemberDto> {
  const [member] = await presentMembers(coopId, [user], tx, 'these');
  return member!;
}

/** Announces a change to the roster (admins) and, where the directory shows it, to the co-op. */
function announce(actor: SessionUser, user: UserRecord, tx: Transaction, opts: { directory?: boolean } = {}) {
  tx.afterCommit(() => {
    publish(rooms.coopAdmins(actor.coopId), RealtimeEvent.memberUpdated, { userId: user.id });
    if (opts.directory && user.farmId) publish(rooms.coop(actor.coopId), RealtimeEvent.farmUpdated, { farmId: user.farmId });
  });
}

/** The co-op's roster for its admin, filtered, sorted and paged in SQL: role, farm, status and last sign-in. */
export async function listMembers(actor: SessionUser, q: MemberListView): Promise<MemberListDto> {
  assertRosterManager(actor);
  return withTenant(actor, async (tx) => {
    const { sql, bind } = membersPageSql(q, actor.coopId);
    const page = await database().query<{ id: string; total: number }>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
    const offset = (q.page - 1) * q.pageSize;
    const counted = async () => {
      const first = membersPageSql({ ...q, page: 1, pageSize: 1 }, actor.coopId);
      return (await database().query<{ total: number }>(first.sql, { bind: first.bind, type: QueryTypes.SELECT, transaction: tx }))[0]?.total ?? 0;
    };
    // Past the last page there is no row to carry the total: count again from the first.
    const total = page[0]?.total ?? (offset === 0 ? 0 : await counted());
    const users = await usersInOrder(actor.coopId, page.map((row) => row.id), tx);
    return { items: await presentMembers(actor.coopId, users, tx, 'these'), total, page: q.page, pageSize: q.pageSize };
  });
}

export async function getMember(actor: SessionUser, userId: string): Promise<MemberDto> {
  assertRosterManager(actor);
  return withTenant(actor, async (tx) => {
    const user = await findUser(userId, tx);
    if (!user || user.coopId !== actor.coopId) throw AppError.notFound('That member');
    return presentOne(actor.coopId, user, tx);
  });
}

/**
 * Makes a member an admin or an admin a member (an apprentice too, once they have a farm). Every
 * session of the person ends and their sockets disconnect, so they come back with the new powers.
 */
export async function changeMemberRole(actor: SessionUser, userId: string, input: MemberRoleChangeInput, ctx: MemberLinkContext): Promise<MemberDto> {
  return withTenant(actor, async (tx) => {
    const user = await lockMember(actor, userId, tx);
    assertNotSelf(actor, user, 'change the role of');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('User', { id: user.id, coopId: user.coopId }), 'role');
    assertVersion(user, input.version);
    if (user.role === input.role) return presentOne(actor.coopId, user, tx);
    if (user.role === 'apprentice' && !user.farmId) {
      throw AppError.conflict(`${user.name} is an apprentice without a farm. A ${input.role} keeps a farm's herd, so attach them to a farm first.`);
    }
    const from = user.role;
    await setRole(user, input.role, tx);
    await revokeFeedsNoLongerAllowed(user, tx, actor.id);
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'member.role_changed', subjectType: 'User', subjectId: user.id, details: { name: user.name, from, to: input.role }, ip: ctx.ip },
      tx,
    );
    tx.afterCommit(() => disconnectRoom(rooms.user(user.id), 'role_changed'));
    announce(actor, user, tx, { directory: true });
    return presentOne(actor.coopId, user, tx);
  });
}

/** Turns an account off with a reason: it cannot sign in, its sessions end and its sockets close at once. */
export async function disableMember(actor: SessionUser, userId: string, input: MemberDisableInput, ctx: MemberLinkContext): Promise<MemberDto> {
  return withTenant(actor, async (tx) => {
    const user = await lockMember(actor, userId, tx);
    assertNotSelf(actor, user, 'turn off');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('User', { id: user.id, coopId: user.coopId }), 'disabled');
    assertVersion(user, input.version);
    if (user.disabledAt) throw AppError.conflict(`${user.name}'s account is already turned off.`);
    await disableUser(user, input.reason, tx);
    await revokeFeedsNoLongerAllowed(user, tx, actor.id);
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'member.disabled', subjectType: 'User', subjectId: user.id, details: { name: user.name, reason: input.reason }, ip: ctx.ip },
      tx,
    );
    tx.afterCommit(() => disconnectRoom(rooms.user(user.id), 'disabled'));
    announce(actor, user, tx, { directory: true });
    return presentOne(actor.coopId, user, tx);
  });
}

/** Turns an account back on; the person signs in again with their own password. */
export async function enableMember(actor: SessionUser, userId: string, input: MemberEnableInput, ctx: MemberLinkContext): Promise<MemberDto> {
  return withTenant(actor, async (tx) => {
    const user = await lockMember(actor, userId, tx);
    assertNotSelf(actor, user, 'turn on');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('User', { id: user.id, coopId: user.coopId }), 'disabled');
    assertVersion(user, input.version);
    if (!user.disabledAt) throw AppError.conflict(`${user.name}'s account is already on.`);
    if (!user.passwordHash && user.disabledReason === INVITATION_WITHDRAWN) {
      throw AppError.conflict(`${user.name}'s invitation was withdrawn. Invite them again instead, so they get a farm and a new link.`);
    }
    await enableUser(user, tx);
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'member.enabled', subjectType: 'User', subjectId: user.id, details: { name: user.name }, ip: ctx.ip },
      tx,
    );
    announce(actor, user, tx, { directory: true });
    return presentOne(actor.coopId, user, tx);
  });
}

async function isNewFarmNameClaimed(coopId: string, name: string, tx: Transaction): Promise<boolean> {
  if (await isFarmNameTaken(coopId, name, tx)) return true;
  const waiting = await Invitation.count({
    where: { coopId, status: 'pending', [Op.and]: [where(fn('lower', col('new_farm_name')), name.trim().toLowerCase())] },
    transaction: tx,
  });
  return waiting > 0;
}

/**
 * The answer an invitation of a new address gets, for an address whose account is in another co-op:
 * nothing is stored, and the holder learns of it by e-mail (at most once a day per co-op), so the
 * admin is not told that the address has an account.
 */
async function answerAsInvited(
  actor: SessionUser,
  input: InvitationInput,
  farm: { farmName: string; existingFarmId: string | null; appUrl: string },
  tx: Transaction,
): Promise<MemberDto> {
  const coopName = (await getCoop(actor.coopId, tx))?.name ?? 'the co-op';
  const mail = invitationForAccountHolderMail({ to: input.email, inviterName: actor.name, coopName, signInUrl: `${farm.appUrl}/sign-in` });
  const day = new Date().toISOString().slice(0, 10);
  await queueMail(tx, `invitation-to-account-holder:${hashToken(input.email.trim().toLowerCase())}:${day}`, mail);
  const user = unsavedUser({ coopId: actor.coopId, farmId: null, email: input.email, name: input.name, role: input.role, passwordHash: null });
  const invitation = Invitation.build({
    coopId: actor.coopId,
    userId: user.id,
    invitedByUserId: actor.id,
    farmId: farm.existingFarmId,
    newFarmName: input.farm.kind === 'new' ? input.farm.name : null,
    createdAt: new Date(),
  });
  const farmNames = new Map(farm.existingFarmId ? [[farm.existingFarmId, farm.farmName]] : []);
  return presentMember(user, { invitation, names: new Map([[actor.id, actor.name]]), farmNames, lastSignInAt: null });
}

/**
 * Invites someone directly by e-mail: their account exists at once without a password, and the
 * e-mailed single-use link lets them set one; their farm is created (or the chosen farm joined) then.
 */
export async function inviteMember(actor: SessionUser, input: InvitationInput, ctx: MemberLinkContext): Promise<MemberDto> {
  assertRosterManager(actor);
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('create', subjectOf('User', { coopId: actor.coopId }));
  return withTenant(actor, async (tx) => {
    let revived: UserRecord | null = null;
    let accountElsewhere = false;
    if (await isEmailRegistered(input.email, tx)) {
      // The roster shows this co-op's people anyway; an account of another co-op is never revealed.
      const existing = await findUserByEmail(input.email, tx);
      if (!existing) {
        accountElsewhere = true;
      } else if (existing.passwordHash || existing.disabledReason !== INVITATION_WITHDRAWN) {
        // Only a withdrawn invitation of this co-op may be sent again to the same address.
        const message = `${existing.name} already has this e-mail address in the co-op; find them in the member list.`;
        throw AppError.conflict(message, { email: [message] });
      } else {
        revived = existing;
      }
    }
    if (await findPendingApplicationId(actor.coopId, input.email, tx)) {
      const message = 'An application from this address is waiting in the queue. Approve it there instead.';
      throw AppError.conflict(message, { email: [message] });
    }

    let farmName: string;
    let existingFarmId: string | null = null;
    if (input.farm.kind === 'existing') {
      const farm = await findFarmRef(actor.coopId, input.farm.farmId, tx);
      if (!farm) throw AppError.validation({ 'farm.farmId': ['Choose a farm of this co-op'] });
      farmName = farm.name;
      existingFarmId = farm.id;
    } else {
      farmName = input.farm.name;
      if (await isNewFarmNameClaimed(actor.coopId, farmName, tx)) {
        const message = `A farm called "${farmName}" is already in the co-op or on its way in. Choose another name, or invite them to that farm.`;
        throw AppError.conflict(message, { 'farm.name': [message] });
      }
    }

    if (accountElsewhere) {
      return answerAsInvited(actor, input, { farmName, existingFarmId, appUrl: ctx.appUrl }, tx);
    }

    let user: UserRecord;
    if (revived) {
      await reviveInvitee(revived, { name: input.name, role: input.role }, tx);
      user = revived;
    } else {
      user = await createUser({ coopId: actor.coopId, farmId: null, email: input.email, name: input.name, role: input.role, passwordHash: null }, tx);
    }
    await Invitation.create(
      {
        coopId: actor.coopId,
        userId: user.id,
        invitedByUserId: actor.id,
        farmId: existingFarmId,
        ...(input.farm.kind === 'new'
          ? { newFarmName: input.farm.name, newFarmLocation: input.farm.location, newFarmTimeZone: input.farm.timeZone, newFarmBreeds: input.farm.breedsKept }
          : {}),
      },
      { transaction: tx },
    );
    const token = await issueToken({ userId: user.id, coopId: actor.coopId, purpose: 'set_password', ttlMinutes: ctx.linkTtlHours * 60 }, tx);
    await recordAudit(
      {
        coopId: actor.coopId,
        actorUserId: actor.id,
        action: 'invitation.sent',
        subjectType: 'User',
        subjectId: user.id,
        details: { name: user.name, email: user.email, role: user.role, farmName, joinsExistingFarm: Boolean(existingFarmId) },
        ip: ctx.ip,
      },
      tx,
    );
    const mail = invitationMail({
      to: user.email,
      name: user.name,
      inviterName: actor.name,
      coopName: (await getCoop(actor.coopId, tx))?.name ?? 'the co-op',
      farmName,
      joinsExistingFarm: Boolean(existingFarmId),
      url: `${ctx.appUrl}/set-password?token=${token}`,
      ttlHours: ctx.linkTtlHours,
    });
    await queueMail(tx, `invitation:${user.id}:${hashToken(token)}`, mail);
    announce(actor, user, tx);
    return presentOne(actor.coopId, user, tx);
  });
}

/**
 * A new set-password link for someone admitted who has not set a password yet (approved applicant
 * or invitee): the older link stops working.
 */
export async function sendSetPasswordLink(actor: SessionUser, userId: string, ctx: MemberLinkContext): Promise<MemberDto> {
  return withTenant(actor, async (tx) => {
    const user = await lockMember(actor, userId, tx);
    if (user.passwordHash) throw AppError.conflict(`${user.name} has already set a password. If they forgot it, "Forgot your password?" on the sign-in page sends them a link.`);
    if (user.disabledAt) throw AppError.conflict(`${user.name}'s account is turned off. Turn it on or invite them again first.`);
    const invitation = (await pendingInvitations(actor.coopId, [user.id], tx)).get(user.id) ?? null;
    const token = await issueToken({ userId: user.id, coopId: actor.coopId, purpose: 'set_password', ttlMinutes: ctx.linkTtlHours * 60 }, tx);
    const url = `${ctx.appUrl}/set-password?token=${token}`;
    const coopName = (await getCoop(actor.coopId, tx))?.name ?? 'the co-op';
    let mail;
    if (invitation) {
      const farm = invitation.farmId ? await findFarmRef(actor.coopId, invitation.farmId, tx) : null;
      mail = invitationMail({
        to: user.email,
        name: user.name,
        inviterName: actor.name,
        coopName,
        farmName: farm?.name ?? invitation.newFarmName ?? '',
        joinsExistingFarm: Boolean(farm),
        url,
        ttlHours: ctx.linkTtlHours,
      });
    } else {
      mail = setPasswordLinkMail({ to: user.email, name: user.name, coopName, url, ttlHours: ctx.linkTtlHours });
    }
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'member.link_sent', subjectType: 'User', subjectId: user.id, details: { name: user.name }, ip: ctx.ip },
      tx,
    );
    await queueMail(tx, `set-password-link:${user.id}:${hashToken(token)}`, mail);
    announce(actor, user, tx);
    return presentOne(actor.coopId, user, tx);
  });
}

/** Withdraws a pending invitation: its link stops working and the account stays off. */
export async function revokeInvitation(actor: SessionUser, userId: string, ctx: MemberLinkContext): Promise<MemberDto> {
  return withTenant(actor, async (tx) => {
    const user = await lockMember(actor, userId, tx);
    const invitation = await Invitation.findOne({ where: { userId: user.id, status: 'pending' }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!invitation) throw AppError.conflict(`No invitation is waiting for ${user.name}.`);
    invitation.set({ status: 'revoked', revokedAt: new Date(), revokedByUserId: actor.id });
    await invitation.save({ transaction: tx });
    await disableUser(user, INVITATION_WITHDRAWN, tx);
    await revokeFeedsNoLongerAllowed(user, tx, actor.id);
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'invitation.revoked', subjectType: 'User', subjectId: user.id, details: { name: user.name, email: user.email }, ip: ctx.ip },
      tx,
    );
    announce(actor, user, tx);
    return presentOne(actor.coopId, user, tx);
  });
}

/**
 * Called when someone sets a password (inside that transaction): a pending invitation is accepted,
 * so the invitee's farm is created, or the chosen farm joined, and announced to the co-op.
 */
export async function acceptPendingInvitation(user: UserRecord, tx: Transaction, ctx: { ip: string | null }): Promise<void> {
  const invitation = await Invitation.findOne({ where: { userId: user.id, status: 'pending' }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!invitation) return;
  let farmId = invitation.farmId;
  let created = false;
  if (!farmId) {
    let name = invitation.newFarmName!;
    // A farm of that name may have joined since the invitation went out; keep both apart by the person's name.
    if (await isFarmNameTaken(user.coopId, name, tx)) name = `${name} (${user.name})`.slice(0, 80);
    const farm = await createFarm(
      user.coopId,
      {
        name,
        location: invitation.newFarmLocation ?? '',
        timeZone: invitation.newFarmTimeZone ?? DEFAULT_FARM_TIME_ZONE,
        weightUnit: 'lb_oz',
        temperatureUnit: 'F',
        breedsKept: invitation.newFarmBreeds ?? [],
        description: '',
      },
      tx,
    );
    farmId = farm.id;
    created = true;
  }
  await attachToFarm(user, farmId, tx);
  // Joining another farm leaves the old one: feeds of the old farm's Almanac stop.
  await revokeFeedsNoLongerAllowed(user, tx, user.id);
  invitation.set({ status: 'accepted', acceptedAt: new Date(), farmId });
  await invitation.save({ transaction: tx });
  await recordAudit(
    { coopId: user.coopId, actorUserId: user.id, action: 'invitation.accepted', subjectType: 'User', subjectId: user.id, details: { name: user.name, farmId, farmCreated: created }, ip: ctx.ip },
    tx,
  );
  const joinedFarm = farmId;
  tx.afterCommit(() => {
    publish(rooms.coop(user.coopId), created ? RealtimeEvent.farmCreated : RealtimeEvent.farmUpdated, { farmId: joinedFarm });
    publish(rooms.coopAdmins(user.coopId), RealtimeEvent.memberUpdated, { userId: user.id });
  });
}
