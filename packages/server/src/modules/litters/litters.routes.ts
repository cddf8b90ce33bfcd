import { Router } from 'express';
import {
  entryReviewSchema, fosteringCreateSchema, housingUnitCreateSchema, keeperCreateSchema, kindlingCreateSchema,
  litterEventCreateSchema, litterListQuerySchema, placementCreateSchema, placementEndSchema, uuidParamSchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { createHousingUnit, endPlacement, listHousingUnits, placeInUnit } from './housing.service';
import {
  addKeeper, fosterCandidates, getLitter, listLitters, recordFostering, recordKindling, recordLitterEvent, reviewLitterEvent,
} from './litters.service';

const id = (value: unknown) => uuidParamSchema.parse(value);

/** /api/litters: kindlings, the dated events that change a litter's kit count, fosterings, keepers. */
export function litterRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listLitters(actorOf(req), litterListQuerySchema.parse(req.query)));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await recordKindling(actorOf(req), kindlingCreateSchema.parse(req.body)));
  });
  router.get('/:litterId', async (req, res) => {
    res.json(await getLitter(actorOf(req), id(req.params.litterId)));
  });
  router.post('/:litterId/events', async (req, res) => {
    res.status(201).json(await recordLitterEvent(actorOf(req), id(req.params.litterId), litterEventCreateSchema.parse(req.body)));
  });
  router.get('/:litterId/foster-candidates', async (req, res) => {
    res.json(await fosterCandidates(actorOf(req), id(req.params.litterId)));
  });
  router.post('/:litterId/fosterings', async (req, res) => {
    res.status(201).json(await recordFostering(actorOf(req), id(req.params.litterId), fosteringCreateSchema.parse(req.body)));
  });
  router.post('/:litterId/keepers', async (req, res) => {
    res.status(201).json(await addKeeper(actorOf(req), id(req.params.litterId), keeperCreateSchema.parse(req.body)));
  });
  return router;
}

/** /api/litter-events/:eventId/review: the mentor's review of an apprentice's litter count. */
export function litterEventRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/:eventId/review', async (req, res) => {
    res.json(await reviewLitterEvent(actorOf(req), id(req.params.eventId), entryReviewSchema.parse(req.body)));
  });
  return router;
}

/** /api/housing-units and /api/housing-placements: hutches and pens, and who is in them from when. */
export function housingRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ units: await listHousingUnits(actorOf(req)) });
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await createHousingUnit(actorOf(req), housingUnitCreateSchema.parse(req.body)));
  });
  router.post('/:unitId/placements', async (req, res) => {
    res.status(201).json(await placeInUnit(actorOf(req), id(req.params.unitId), placementCreateSchema.parse(req.body)));
  });
  return router;
}

export function housingPlacementRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/:placementId/end', async (req, res) => {
    res.json(await endPlacement(actorOf(req), id(req.params.placementId), placementEndSchema.parse(req.body)));
  });
  return router;
}
