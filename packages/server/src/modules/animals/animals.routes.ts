import { Router } from 'express';
import {
  animalCreateSchema, animalListQuerySchema, animalNoteCreateSchema, animalUpdateSchema, custodyMoveSchema, entryReviewSchema,
  outsideAnimalQuerySchema, outsideAnimalSchema, outsideMergeSchema, pedigreeCardQuerySchema, pedigreeQuerySchema,
  statusEventSchema, trialMatingSchema, uuidParamSchema, weighInCreateSchema, weighInListQuerySchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { createAnimal, updateAnimal } from './animal-edits.service';
import { getAnimal, listHerd } from './animals.service';
import { moveAnimal } from './custody-moves.service';
import { recordStatus } from './animal-status.service';
import { listOutsideAnimals, mergeOutsideAnimal, registerOutsideAnimal } from './outside-animals.service';
import { getPedigreeCard, getPedigreeTree, listPedigreeCards, trialMatings } from './pedigree.service';
import { createAnimalNote, createWeighIn, listAnimalWeighIns, reviewAnimalNote, reviewWeighIn } from './weigh-ins.service';

/** /api/animals: the farm's own herd, one animal's record, its pedigree picture, its histories. */
export function animalRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  const id = (value: unknown) => uuidParamSchema.parse(value);

  router.get('/', async (req, res) => {
    res.json(await listHerd(actorOf(req), animalListQuerySchema.parse(req.query)));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await createAnimal(actorOf(req), animalCreateSchema.parse(req.body)));
  });
  router.get('/:animalId', async (req, res) => {
    res.json(await getAnimal(actorOf(req), id(req.params.animalId)));
  });
  router.patch('/:animalId', async (req, res) => {
    res.json(await updateAnimal(actorOf(req), id(req.params.animalId), animalUpdateSchema.parse(req.body)));
  });
  router.get('/:animalId/pedigree', async (req, res) => {
    const { generations } = pedigreeQuerySchema.parse(req.query);
    res.json(await getPedigreeTree(actorOf(req), id(req.params.animalId), generations));
  });
  router.get('/:animalId/weigh-ins', async (req, res) => {
    res.json(await listAnimalWeighIns(actorOf(req), id(req.params.animalId), weighInListQuerySchema.parse(req.query)));
  });
  router.post('/:animalId/status-events', async (req, res) => {
    res.status(201).json(await recordStatus(actorOf(req), id(req.params.animalId), statusEventSchema.parse(req.body)));
  });
  router.post('/:animalId/custody-events', async (req, res) => {
    res.status(201).json(await moveAnimal(actorOf(req), id(req.params.animalId), custodyMoveSchema.parse(req.body)));
  });
  router.post('/:animalId/notes', async (req, res) => {
    res.status(201).json(await createAnimalNote(actorOf(req), id(req.params.animalId), animalNoteCreateSchema.parse(req.body)));
  });
  return router;
}

/** /api/pedigree-cards: what every member may see of any animal of the co-op. */
export function pedigreeCardRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listPedigreeCards(actorOf(req), pedigreeCardQuerySchema.parse(req.query)));
  });
  router.get('/:animalId', async (req, res) => {
    res.json(await getPedigreeCard(actorOf(req), uuidParamSchema.parse(req.params.animalId)));
  });
  return router;
}

/** /api/trial-matings: a doe with several bucks, side by side (computes, stores nothing). */
export function trialMatingRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/', async (req, res) => {
    res.json(await trialMatings(actorOf(req), trialMatingSchema.parse(req.body)));
  });
  return router;
}

/** /api/weigh-ins and /api/animal-notes: entries, and the mentor's review of an apprentice's. */
export function weighInRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/', async (req, res) => {
    res.status(201).json(await createWeighIn(actorOf(req), weighInCreateSchema.parse(req.body)));
  });
  router.post('/:weighInId/review', async (req, res) => {
    res.json(await reviewWeighIn(actorOf(req), uuidParamSchema.parse(req.params.weighInId), entryReviewSchema.parse(req.body)));
  });
  return router;
}

export function animalNoteRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/:noteId/review', async (req, res) => {
    res.json(await reviewAnimalNote(actorOf(req), uuidParamSchema.parse(req.params.noteId), entryReviewSchema.parse(req.body)));
  });
  return router;
}

/** /api/outside-animals: the co-op's registry of ancestors known from papers, and the admin's merge. */
export function outsideAnimalRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    const { search } = outsideAnimalQuerySchema.parse(req.query);
    res.json({ animals: await listOutsideAnimals(actorOf(req), search) });
  });
  router.post('/', async (req, res) => {
    const result = await registerOutsideAnimal(actorOf(req), outsideAnimalSchema.parse(req.body));
    res.status(result.matched ? 200 : 201).json(result);
  });
  router.post('/:animalId/merge', async (req, res) => {
    const { intoId } = outsideMergeSchema.parse(req.body);
    res.json(await mergeOutsideAnimal(actorOf(req), uuidParamSchema.parse(req.params.animalId), intoId));
  });
  return router;
}
