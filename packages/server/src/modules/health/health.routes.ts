import { Router } from 'express';
import { z } from 'zod';
import { temperatureReadingCreateSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { heatCaution, listTemperatures, recordTemperature } from './temperature.service';

/** /api/temperature-readings: the barn's temperature, logged by the farm's members and apprentices. */
export function temperatureRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    const { days } = z.strictObject({ days: z.coerce.number().int().min(1).max(366).default(30) }).parse(req.query);
    res.json(await listTemperatures(actorOf(req), days));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await recordTemperature(actorOf(req), temperatureReadingCreateSchema.parse(req.body)));
  });
  return router;
}

/** /api/heat-caution: Commons' card when the farm's latest reading is 85 °F / 29.4 °C or above. */
export function heatCautionRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await heatCaution(actorOf(req)));
  });
  return router;
}
