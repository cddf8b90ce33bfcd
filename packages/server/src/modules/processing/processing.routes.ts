import { Router } from 'express';
import { processingMarkCancelSchema, processingMarkCreateSchema, processingRecordCreateSchema, uuidParamSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { cancelMark, listProcessing, markForProcessing, recordProcessing } from './processing.service';

/** /api/processing-records: what the farm processed, with its yields (apprentices read only). */
export function processingRecordRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listProcessing(actorOf(req)));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await recordProcessing(actorOf(req), processingRecordCreateSchema.parse(req.body)));
  });
  return router;
}

/** /api/processing-marks: animals and groups set aside for a planned processing date. */
export function processingMarkRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/', async (req, res) => {
    res.status(201).json(await markForProcessing(actorOf(req), processingMarkCreateSchema.parse(req.body)));
  });
  router.post('/:markId/cancellation', async (req, res) => {
    const { version } = processingMarkCancelSchema.parse(req.body);
    res.json(await cancelMark(actorOf(req), uuidParamSchema.parse(req.params.markId), version));
  });
  return router;
}
