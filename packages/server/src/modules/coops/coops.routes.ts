import { ForbiddenError } from '@casl/ability';
import { Router } from 'express';
import { coopRulesUpdateSchema, subjectOf } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { getCoopSettings, updateCoopRules } from './coops.service';

/** `/api/coop`: the signed-in person's own co-op (the tenant comes from the session, never the URL). */
export function coopRoutes(): Router {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json(await getCoopSettings(actorOf(req)));
  });

  router.patch('/', async (req, res) => {
    ForbiddenError.from(req.ability).throwUnlessCan('update', subjectOf('Coop', { id: actorOf(req).coopId }));
    res.json(await updateCoopRules(actorOf(req), coopRulesUpdateSchema.parse(req.body), { ip: req.ip ?? null }));
  });

  return router;
}
