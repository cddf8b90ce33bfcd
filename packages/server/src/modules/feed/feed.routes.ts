import { Router } from 'express';
import { feedPurchaseCreateSchema, feedUseCreateSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { listFeed, recordFeedPurchase, recordFeedUse } from './feed.service';

/** /api/feed: the farm's feed purchases and feed given. */
export function feedRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listFeed(actorOf(req)));
  });
  router.post('/purchases', async (req, res) => {
    res.status(201).json(await recordFeedPurchase(actorOf(req), feedPurchaseCreateSchema.parse(req.body)));
  });
  router.post('/uses', async (req, res) => {
    res.status(201).json(await recordFeedUse(actorOf(req), feedUseCreateSchema.parse(req.body)));
  });
  return router;
}
