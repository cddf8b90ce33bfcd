import { ForbiddenError } from '@casl/ability';
import { Router } from 'express';
import { auditEventQuerySchema, subjectOf } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { listAuditEvents } from './audit.service';

/** `/api/audit-events`: the co-op's audit log, for its admins. */
export function auditRoutes(): Router {
  const router = Router();
  router.use(requireUser, (req, _res, next) => {
    ForbiddenError.from(req.ability).throwUnlessCan('read', subjectOf('AuditEvent', { coopId: actorOf(req).coopId }));
    next();
  });

  router.get('/', async (req, res) => {
    res.json(await listAuditEvents(actorOf(req), auditEventQuerySchema.parse(req.query)));
  });

  return router;
}
