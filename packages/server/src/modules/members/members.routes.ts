import { ForbiddenError } from '@casl/ability';
import { Router, type NextFunction, type Request, type Response } from 'express';
import {
  invitationSchema,
  memberDisableSchema,
  memberEnableSchema,
  memberListViewSchema,
  memberRoleChangeSchema,
  subjectOf,
  uuidParamSchema,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import {
  changeMemberRole,
  disableMember,
  enableMember,
  getMember,
  inviteMember,
  listMembers,
  revokeInvitation,
  sendSetPasswordLink,
  type MemberLinkContext,
} from './members.service';

function linkContext(config: Config, req: Request): MemberLinkContext {
  return { appUrl: config.appUrl, linkTtlHours: config.membership.linkTtlHours, ip: req.ip ?? null };
}

/** Authorize before validating: someone who may not manage the roster learns nothing from field errors. */
function requireRosterManager(req: Request, _res: Response, next: NextFunction) {
  ForbiddenError.from(req.ability).throwUnlessCan('manage', subjectOf('Membership', { coopId: actorOf(req).coopId }));
  next();
}

/** `/api/members`: the admin's roster (roles, turning accounts off and on, set-password links, invitations). */
export function memberRoutes(config: Config): Router {
  const router = Router();
  router.use(requireUser, requireRosterManager);
  const userIdOf = (req: Request) => uuidParamSchema.parse(req.params.userId);

  router.get('/', async (req, res) => {
    res.json(await listMembers(actorOf(req), memberListViewSchema.parse(req.query)));
  });

  router.get('/:userId', async (req, res) => {
    res.json(await getMember(actorOf(req), userIdOf(req)));
  });

  router.patch('/:userId/role', async (req, res) => {
    res.json(await changeMemberRole(actorOf(req), userIdOf(req), memberRoleChangeSchema.parse(req.body), linkContext(config, req)));
  });

  router.post('/:userId/disable', async (req, res) => {
    res.json(await disableMember(actorOf(req), userIdOf(req), memberDisableSchema.parse(req.body), linkContext(config, req)));
  });

  router.post('/:userId/enable', async (req, res) => {
    res.json(await enableMember(actorOf(req), userIdOf(req), memberEnableSchema.parse(req.body), linkContext(config, req)));
  });

  router.post('/:userId/set-password-link', async (req, res) => {
    res.json(await sendSetPasswordLink(actorOf(req), userIdOf(req), linkContext(config, req)));
  });

  router.delete('/:userId/invitation', async (req, res) => {
    res.json(await revokeInvitation(actorOf(req), userIdOf(req), linkContext(config, req)));
  });

  return router;
}

/** `/api/invitations`: the admin invites someone directly by e-mail. */
export function invitationRoutes(config: Config): Router {
  const router = Router();
  router.use(requireUser, requireRosterManager);

  router.post('/', async (req, res) => {
    res.status(201).json(await inviteMember(actorOf(req), invitationSchema.parse(req.body), linkContext(config, req)));
  });

  return router;
}
