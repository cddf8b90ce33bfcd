import { Router } from 'express';
import { uuidParamSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { getFarm, listFarms, updateFarmProfile } from './farms.service';

export function farmRoutes(): Router {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json({ farms: await listFarms(actorOf(req)) });
  });

  router.get('/:farmId', async (req, res) => {
    res.json(await getFarm(actorOf(req), uuidParamSchema.parse(req.params.farmId)));
  });

  router.patch('/:farmId', async (req, res) => {
    const farmId = uuidParamSchema.parse(req.params.farmId);
    res.json(await updateFarmProfile(actorOf(req), farmId, req.body));
  });

  return router;
}
