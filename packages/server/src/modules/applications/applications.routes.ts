import { ForbiddenError } from '@casl/ability';
import { Router, type Request } from 'express';
import {
  subjectOf,
  applicationApprovalSchema,
  applicationListQuerySchema,
  applicationRejectionSchema,
  applicationSchema,
  applicationWithdrawalSchema,
  uuidParamSchema,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { applicationLimiters } from '../../http/rate-limit';
import {
  approveApplication,
  countUnreadApplications,
  getApplication,
  getPublicCoop,
  listApplications,
  markApplicationViewed,
  rejectApplication,
  submitApplication,
  withdrawApplication,
  type DecisionContext,
} from './applications.service';

function decisionContext(config: Config, req: Request): DecisionContext {
  return { appUrl: config.appUrl, linkTtlHours: config.membership.linkTtlHours, ip: req.ip ?? null };
}

/** `/api/apply/:coopSlug`: the public form, the one route where the tenant comes from the URL. */
export function publicApplicationRoutes(config: Config): Router {
  const router = Router();

  router.get('/:coopSlug', async (req, res) => {
    res.json(await getPublicCoop(String(req.params.coopSlug)));
  });

  router.post('/:coopSlug', ...applicationLimiters(config), async (req, res) => {
    const input = applicationSchema.parse(req.body);
    const { receipt, replayed } = await submitApplication(String(req.params.coopSlug), input, { appUrl: config.appUrl, ip: req.ip ?? null });
    res.status(replayed ? 200 : 201).json(receipt);
  });

  return router;
}

/** `/api/applications`: the admin's queue and decisions. */
export function applicationRoutes(config: Config): Router {
  const router = Router();
  // Authorize before validating: someone who may not review learns nothing from field errors.
  router.use(requireUser, (req, _res, next) => {
    ForbiddenError.from(req.ability).throwUnlessCan('manage', subjectOf('Application', { coopId: actorOf(req).coopId }));
    next();
  });

  router.get('/', async (req, res) => {
    res.json(await listApplications(actorOf(req), applicationListQuerySchema.parse(req.query)));
  });

  router.get('/unread-count', async (req, res) => {
    res.json({ count: await countUnreadApplications(actorOf(req)) });
  });

  router.get('/:applicationId', async (req, res) => {
    res.json(await getApplication(actorOf(req), uuidParamSchema.parse(req.params.applicationId)));
  });

  router.post('/:applicationId/views', async (req, res) => {
    await markApplicationViewed(actorOf(req), uuidParamSchema.parse(req.params.applicationId));
    res.status(204).end();
  });

  router.post('/:applicationId/approval', async (req, res) => {
    const id = uuidParamSchema.parse(req.params.applicationId);
    res.json(await approveApplication(actorOf(req), id, applicationApprovalSchema.parse(req.body ?? {}), decisionContext(config, req)));
  });

  router.post('/:applicationId/rejection', async (req, res) => {
    const id = uuidParamSchema.parse(req.params.applicationId);
    res.json(await rejectApplication(actorOf(req), id, applicationRejectionSchema.parse(req.body ?? {}), decisionContext(config, req)));
  });

  router.post('/:applicationId/withdrawal', async (req, res) => {
    const id = uuidParamSchema.parse(req.params.applicationId);
    res.json(await withdrawApplication(actorOf(req), id, applicationWithdrawalSchema.parse(req.body ?? {}), decisionContext(config, req)));
  });

  return router;
}
