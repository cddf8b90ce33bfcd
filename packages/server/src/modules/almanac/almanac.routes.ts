import { Router } from 'express';
import {
  agendaQuerySchema, cycleSettingsPatchSchema, doeBoardQuerySchema, digestPreferenceSchema, entryReviewSchema, palpationCreateSchema,
  serviceClosureSchema, serviceCreateSchema, serviceListQuerySchema, taskBulkSchema, taskUpdateSchema, treatmentCreateSchema, treatmentListQuerySchema, withdrawalQuerySchema,
  uuidParamSchema,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { breedingStock, closeService, getService, listServices, recordPalpation, recordService } from './breeding.service';
import { calendarFeedFor, calendarFeedStatus, feedNotFound, renewCalendarFeed, revokeCalendarFeed } from './calendar-feed.service';
import { getCycleSettings, updateCycleSettings } from './cycle-settings.service';
import { breedingRecord, doeBoard } from './doe-board.service';
import { getDigestPreference, setDigestPreference } from './morning-digest.service';
import { almanacSummary, bulkUpdateTasks, listAgenda, listSharedDays, reviewTask, updateTask } from './tasks.service';
import { listTreatments, listWithdrawals, recordTreatment } from './treatments.service';

const id = (value: unknown) => uuidParamSchema.parse(value);

/** /api/almanac: the farm's agenda and month, Commons' summary, tasks, cycle settings, the feed, the morning e-mail. */
export function almanacRoutes(config: Pick<Config, 'appUrl'>): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/tasks', async (req, res) => {
    res.json(await listAgenda(actorOf(req), agendaQuerySchema.parse(req.query)));
  });
  router.get('/shared-days', async (req, res) => {
    res.json(await listSharedDays(actorOf(req), agendaQuerySchema.parse(req.query)));
  });
  router.get('/summary', async (req, res) => {
    res.json(await almanacSummary(actorOf(req)));
  });
  router.post('/tasks/bulk', async (req, res) => {
    res.json(await bulkUpdateTasks(actorOf(req), taskBulkSchema.parse(req.body)));
  });
  router.patch('/tasks/:taskId', async (req, res) => {
    res.json(await updateTask(actorOf(req), id(req.params.taskId), taskUpdateSchema.parse(req.body)));
  });
  router.post('/tasks/:taskId/review', async (req, res) => {
    res.json(await reviewTask(actorOf(req), id(req.params.taskId), entryReviewSchema.parse(req.body)));
  });
  router.get('/doe-board', async (req, res) => {
    res.json(await doeBoard(actorOf(req), doeBoardQuerySchema.parse(req.query)));
  });
  router.get('/does/:animalId/breeding-record', async (req, res) => {
    res.json(await breedingRecord(actorOf(req), id(req.params.animalId)));
  });
  router.get('/settings', async (req, res) => {
    res.json(await getCycleSettings(actorOf(req)));
  });
  router.patch('/settings', async (req, res) => {
    res.json(await updateCycleSettings(actorOf(req), cycleSettingsPatchSchema.parse(req.body)));
  });
  router.get('/breeding-stock', async (req, res) => {
    res.json(await breedingStock(actorOf(req)));
  });
  router.get('/calendar-feed', async (req, res) => {
    res.json(await calendarFeedStatus(actorOf(req)));
  });
  router.post('/calendar-feed', async (req, res) => {
    res.status(201).json(await renewCalendarFeed(actorOf(req), config.appUrl));
  });
  router.delete('/calendar-feed', async (req, res) => {
    await revokeCalendarFeed(actorOf(req));
    res.status(204).end();
  });
  router.get('/morning-email', async (req, res) => {
    res.json(await getDigestPreference(actorOf(req)));
  });
  router.put('/morning-email', async (req, res) => {
    res.json(await setDigestPreference(actorOf(req), digestPreferenceSchema.parse(req.body)));
  });
  return router;
}

/** /api/services: services of the farm's does, their palpations, closing one as missed. */
export function serviceRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listServices(actorOf(req), serviceListQuerySchema.parse(req.query)));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await recordService(actorOf(req), serviceCreateSchema.parse(req.body)));
  });
  router.get('/:serviceId', async (req, res) => {
    res.json(await getService(actorOf(req), id(req.params.serviceId)));
  });
  router.post('/:serviceId/palpations', async (req, res) => {
    res.status(201).json(await recordPalpation(actorOf(req), id(req.params.serviceId), palpationCreateSchema.parse(req.body)));
  });
  router.post('/:serviceId/closure', async (req, res) => {
    res.json(await closeService(actorOf(req), id(req.params.serviceId), serviceClosureSchema.parse(req.body)));
  });
  return router;
}

/** /api/treatments: what a doe is being treated with (checked before she is bred). */
export function treatmentRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ treatments: await listTreatments(actorOf(req), treatmentListQuerySchema.parse(req.query)) });
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await recordTreatment(actorOf(req), treatmentCreateSchema.parse(req.body)));
  });
  return router;
}

/** /api/withdrawals: what is under a veterinarian's withdrawal today (of one animal or group, or the farm's). */
export function withdrawalRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listWithdrawals(actorOf(req), withdrawalQuerySchema.parse(req.query)));
  });
  return router;
}

/** /api/calendar-feeds/:token.ics: the public, secret-address iCalendar feed (no session: phone calendars fetch it). */
export function calendarFeedRoutes(config: Pick<Config, 'appUrl'>): Router {
  const router = Router();
  router.get('/:file', async (req, res) => {
    const match = /^(.+)\.ics$/.exec(req.params.file);
    const body = match ? await calendarFeedFor(match[1]!, { appUrl: config.appUrl }) : null;
    if (!body) throw feedNotFound();
    res.set({
      'Content-Type': 'text/calendar; charset=utf-8',
      'Content-Disposition': 'inline; filename="almanac.ics"',
      'Cache-Control': 'private, max-age=300',
      'Referrer-Policy': 'no-referrer',
    });
    res.send(body);
  });
  return router;
}
