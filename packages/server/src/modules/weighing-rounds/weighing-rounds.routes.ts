import { Router } from 'express';
import { weighingRoundCreateSchema, weighingRoundSetSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { roundCandidates, saveRound } from './weighing-rounds.service';

/** /api/weighing-rounds: what a round weighs, and saving a round's weights as one batch. */
export function weighingRoundRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/candidates', async (req, res) => {
    res.json(await roundCandidates(actorOf(req), weighingRoundSetSchema.parse(req.query)));
  });
  router.post('/', async (req, res) => {
    const { round, created } = await saveRound(actorOf(req), weighingRoundCreateSchema.parse(req.body));
    res.status(created ? 201 : 200).json(round);
  });
  return router;
}
