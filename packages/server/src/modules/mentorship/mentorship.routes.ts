import { Router, type Request } from 'express';
import {
  acceptManySchema, choreEntrySchema, choreLogQuerySchema, choreResubmitSchema, mentorshipSettingsSchema, photoUploadFieldsSchema,
  reviewDecisionSchema, reviewItemKinds, reviewQueueQuerySchema, skillMarkSchema, uuidParamSchema,
} from '@burrowline/shared';
import { z } from 'zod';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { acceptUpload, uploadedFiles } from '../../http/uploads';
import { acceptMany, decideReviewItem, reviewQueue } from './mentorship-review.service';
import {
  addPhotosToChore, assertCanAddChorePhotos, choreChoices, getMentorshipSettings, logChore, mentorshipHome, myChoreLog, resubmitChore, updateMentorshipSettings,
} from './mentorship.service';
import { getApprentice, listApprentices, markSkill, recordOfSkillsPdf } from './skills.service';

const id = (req: Request, name: string) => uuidParamSchema.parse(req.params[name]);
const kindParam = z.enum(reviewItemKinds, { message: 'Not a kind of entry' });
const skillKeyParam = z.string().regex(/^[a-z0-9-]{1,60}$/, 'Not a skill');

/** /api/mentorship: the apprentice's chore log, the mentor's review queue, skills and their record. */
export function mentorshipRoutes(config: Config): Router {
  const router = Router();
  const perUpload = config.uploads.photosPerUpload;
  const limits = { photoMaxBytes: config.uploads.photoMaxBytes, photosPerAnimal: config.uploads.photosPerAnimal, photosPerUpload: perUpload };
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await mentorshipHome(actorOf(req)));
  });
  router.get('/settings', async (req, res) => {
    res.json(await getMentorshipSettings(actorOf(req)));
  });
  router.put('/settings', async (req, res) => {
    res.json(await updateMentorshipSettings(actorOf(req), mentorshipSettingsSchema.parse(req.body)));
  });
  router.get('/choices', async (req, res) => {
    res.json(await choreChoices(actorOf(req)));
  });
  router.get('/chores', async (req, res) => {
    res.json(await myChoreLog(actorOf(req), choreLogQuerySchema.parse(req.query)));
  });
  router.post('/chores', async (req, res) => {
    res.status(201).json(await logChore(actorOf(req), choreEntrySchema.parse(req.body)));
  });
  router.put('/chores/:choreId', async (req, res) => {
    res.json(await resubmitChore(actorOf(req), id(req, 'choreId'), choreResubmitSchema.parse(req.body)));
  });
  router.post(
    '/chores/:choreId/photos',
    // Who may upload is settled before a byte of the file is read.
    async (req, _res, next) => {
      await assertCanAddChorePhotos(actorOf(req), id(req, 'choreId'));
      next();
    },
    acceptUpload({ field: 'photos', maxFiles: perUpload, maxBytes: limits.photoMaxBytes, noun: 'photo' }),
    async (req, res) => {
      const { caption } = photoUploadFieldsSchema.parse(req.body ?? {});
      res.status(201).json({ photos: await addPhotosToChore(actorOf(req), id(req, 'choreId'), { files: uploadedFiles(req), caption }, limits) });
    },
  );
  router.get('/review', async (req, res) => {
    res.json(await reviewQueue(actorOf(req), reviewQueueQuerySchema.parse(req.query)));
  });
  router.post('/review/accept-many', async (req, res) => {
    res.json(await acceptMany(actorOf(req), acceptManySchema.parse(req.body)));
  });
  router.post('/review/:kind/:itemId', async (req, res) => {
    res.json(await decideReviewItem(actorOf(req), kindParam.parse(req.params.kind), id(req, 'itemId'), reviewDecisionSchema.parse(req.body)));
  });
  router.get('/apprentices', async (req, res) => {
    res.json(await listApprentices(actorOf(req)));
  });
  router.get('/apprentices/:apprenticeId', async (req, res) => {
    res.json(await getApprentice(actorOf(req), id(req, 'apprenticeId')));
  });
  router.put('/apprentices/:apprenticeId/skills/:skillKey', async (req, res) => {
    res.json(await markSkill(actorOf(req), id(req, 'apprenticeId'), skillKeyParam.parse(req.params.skillKey), skillMarkSchema.parse(req.body)));
  });
  router.get('/apprentices/:apprenticeId/record-of-skills', async (req, res) => {
    const file = await recordOfSkillsPdf(actorOf(req), id(req, 'apprenticeId'));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.send(file.body);
  });
  return router;
}
