import { Router } from 'express';
import {
  feedBookQuerySchema, feedEntryRemovalSchema, feedPurchaseCreateSchema, feedPurchaseUpdateSchema, feedUseCreateSchema, feedUseUpdateSchema, uuidParamSchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { correctFeedPurchase, correctFeedUse, listFeed, recordFeedPurchase, recordFeedUse, removeFeedPurchase, removeFeedUse } from './feed.service';

const id = (value: unknown) => uuidParamSchema.parse(value);

/** /api/feed: the farm's feed purchases and feed given, each correctable and removable from the version seen. */
export function feedRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listFeed(actorOf(req), feedBookQuerySchema.parse(req.query)));
  });
  router.post('/purchases', async (req, res) => {
    res.status(201).json(await recordFeedPurchase(actorOf(req), feedPurchaseCreateSchema.parse(req.body)));
  });
  router.post('/uses', async (req, res) => {
    res.status(201).json(await recordFeedUse(actorOf(req), feedUseCreateSchema.parse(req.body)));
  });
  router.put('/purchases/:purchaseId', async (req, res) => {
    res.json(await correctFeedPurchase(actorOf(req), id(req.params.purchaseId), feedPurchaseUpdateSchema.parse(req.body)));
  });
  router.delete('/purchases/:purchaseId', async (req, res) => {
    res.json(await removeFeedPurchase(actorOf(req), id(req.params.purchaseId), feedEntryRemovalSchema.parse(req.query).version));
  });
  router.put('/uses/:useId', async (req, res) => {
    res.json(await correctFeedUse(actorOf(req), id(req.params.useId), feedUseUpdateSchema.parse(req.body)));
  });
  router.delete('/uses/:useId', async (req, res) => {
    res.json(await removeFeedUse(actorOf(req), id(req.params.useId), feedEntryRemovalSchema.parse(req.query).version));
  });
  return router;
}
