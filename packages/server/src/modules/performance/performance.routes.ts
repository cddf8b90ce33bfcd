import { Router } from 'express';
import { performanceQuerySchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { farmPerformance } from './performance.service';

/** /api/performance: the farm's performance tables and keep and cull suggestions (read-only). */
export function performanceRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await farmPerformance(actorOf(req), performanceQuerySchema.parse(req.query)));
  });
  return router;
}
