import { Router } from 'express';
import { z } from 'zod';
import { notificationListQuerySchema, notificationPreferencesSchema } from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import {
  getNotificationPreferences, listNotifications, markAllRead, markRead, setNotificationPreferences, unreadCount,
} from './notifications.service';

const notificationIdSchema = z.uuid({ error: 'That notification was not found' });

/** /api/notifications: the signed-in person's own bell, and how they want to be e-mailed. */
export function notificationRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listNotifications(actorOf(req), notificationListQuerySchema.parse(req.query)));
  });
  router.get('/unread', async (req, res) => {
    res.json(await unreadCount(actorOf(req)));
  });
  router.post('/read', async (req, res) => {
    res.json(await markAllRead(actorOf(req)));
  });
  router.get('/preferences', async (req, res) => {
    res.json(await getNotificationPreferences(actorOf(req)));
  });
  router.put('/preferences', async (req, res) => {
    res.json(await setNotificationPreferences(actorOf(req), notificationPreferencesSchema.parse(req.body)));
  });
  router.post('/:notificationId/read', async (req, res) => {
    res.json(await markRead(actorOf(req), notificationIdSchema.parse(req.params.notificationId)));
  });
  return router;
}
