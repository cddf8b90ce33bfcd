import { Router } from 'express';
import { breedCreateSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { createBreed, listBreeds } from './breeds.service';

export function breedRoutes(): Router {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json({ breeds: await listBreeds(actorOf(req)) });
  });

  router.post('/', async (req, res) => {
    res.status(201).json(await createBreed(actorOf(req), breedCreateSchema.parse(req.body)));
  });

  return router;
}
