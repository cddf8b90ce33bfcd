import { Router } from 'express';
import { groupWeighInCreateSchema, growOutGroupCloseSchema, growOutGroupCreateSchema, growOutListQuerySchema, uuidParamSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { closeGroup, formGroup, getGroup, listGroups, litterChoices, recordGroupWeighIn } from './grow-out.service';

const id = (value: unknown) => uuidParamSchema.parse(value);

/** /api/grow-out: the farm's grow-out groups, their weigh-ins, projections and ready dates. */
export function growOutRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/groups', async (req, res) => {
    res.json(await listGroups(actorOf(req), growOutListQuerySchema.parse(req.query)));
  });
  router.post('/groups', async (req, res) => {
    res.status(201).json(await formGroup(actorOf(req), growOutGroupCreateSchema.parse(req.body)));
  });
  router.get('/litter-choices', async (req, res) => {
    res.json(await litterChoices(actorOf(req)));
  });
  router.get('/groups/:groupId', async (req, res) => {
    res.json(await getGroup(actorOf(req), id(req.params.groupId)));
  });
  router.post('/groups/:groupId/weigh-ins', async (req, res) => {
    res.status(201).json(await recordGroupWeighIn(actorOf(req), id(req.params.groupId), groupWeighInCreateSchema.parse(req.body)));
  });
  router.post('/groups/:groupId/close', async (req, res) => {
    res.json(await closeGroup(actorOf(req), id(req.params.groupId), growOutGroupCloseSchema.parse(req.body)));
  });
  return router;
}
