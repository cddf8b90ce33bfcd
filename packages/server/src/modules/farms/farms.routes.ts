import { Router } from 'express';
import { farmCoordinatesSchema, uuidParamSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { getFarm, listFarms, setFarmCoordinates, updateFarmProfile } from './farms.service';

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

  router.put('/:farmId/coordinates', async (req, res) => {
    const farmId = uuidParamSchema.parse(req.params.farmId);
    res.json(await setFarmCoordinates(actorOf(req), farmId, farmCoordinatesSchema.parse(req.body)));
  });

  return router;
}
