import { Router } from 'express';
import { z } from 'zod';
import {
  chatHideSchema, chatMessageEditSchema, chatMessageIdSchema, chatMessageInputSchema, chatMessagesQuerySchema, chatMuteSchema,
  chatPeopleQuerySchema, chatReactions, chatReadSchema, chatSearchQuerySchema, chatSubjectTypeSchema, chatThreadIdSchema, chatTopicSchema,
  chatUserIdSchema, CHAT_ATTACHMENTS_MAX,
  ClientEvent, rooms,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { onClientEvent } from '../../lib/realtime';
import { actorOf, requireUser } from '../../http/ability';
import { acceptUpload, uploadedFiles } from '../../http/uploads';
import {
  assertCanShareChatPhotos, deleteMessage, editMessage, getThread, hideMessage, liftMute, listMessages, listMutes, listThreads, markRead, mentionablePeople,
  mayJoinThread, mutePerson, openSubjectThread, postMessage, searchMessages, setReaction, shareChatPhotos, startTopic,
} from './chat.service';

const reactionSchema = z.enum(chatReactions, { error: 'That reaction is not one of the set' });
const subjectIdSchema = z.uuid({ error: 'That thread was not found' });

/** /api/chat: the co-op's channel, topics and the threads beside subjects; messages, reads, search, moderation. */
export function chatRoutes(config: Config): Router {
  const router = Router();
  const limits = { photoMaxBytes: config.uploads.photoMaxBytes, photosPerAnimal: config.uploads.photosPerAnimal, photosPerUpload: CHAT_ATTACHMENTS_MAX };
  router.use(requireUser);
  router.get('/threads', async (req, res) => {
    res.json(await listThreads(actorOf(req)));
  });
  router.post('/threads', async (req, res) => {
    res.status(201).json(await startTopic(actorOf(req), chatTopicSchema.parse(req.body)));
  });
  router.post('/subjects/:subjectType/:subjectId/open', async (req, res) => {
    res.json(await openSubjectThread(actorOf(req), chatSubjectTypeSchema.parse(req.params.subjectType), subjectIdSchema.parse(req.params.subjectId)));
  });
  router.get('/threads/:threadId', async (req, res) => {
    res.json(await getThread(actorOf(req), chatThreadIdSchema.parse(req.params.threadId)));
  });
  router.get('/threads/:threadId/messages', async (req, res) => {
    res.json(await listMessages(actorOf(req), chatThreadIdSchema.parse(req.params.threadId), chatMessagesQuerySchema.parse(req.query)));
  });
  router.post('/threads/:threadId/messages', async (req, res) => {
    const sent = await postMessage(actorOf(req), chatThreadIdSchema.parse(req.params.threadId), chatMessageInputSchema.parse(req.body));
    res.status(sent.created ? 201 : 200).json(sent.message);
  });
  router.post(
    '/threads/:threadId/attachments',
    // Who may share photos here is settled before a byte of the file is read.
    async (req, _res, next) => {
      await assertCanShareChatPhotos(actorOf(req), chatThreadIdSchema.parse(req.params.threadId));
      next();
    },
    acceptUpload({ field: 'photos', maxFiles: CHAT_ATTACHMENTS_MAX, maxBytes: limits.photoMaxBytes, noun: 'photo' }),
    async (req, res) => {
      res.status(201).json({ photos: await shareChatPhotos(actorOf(req), chatThreadIdSchema.parse(req.params.threadId), uploadedFiles(req), limits) });
    },
  );
  router.post('/threads/:threadId/read', async (req, res) => {
    res.json(await markRead(actorOf(req), chatThreadIdSchema.parse(req.params.threadId), chatReadSchema.parse(req.body).seq));
  });
  router.get('/threads/:threadId/people', async (req, res) => {
    res.json(await mentionablePeople(actorOf(req), chatThreadIdSchema.parse(req.params.threadId), chatPeopleQuerySchema.parse(req.query).q));
  });
  router.patch('/messages/:messageId', async (req, res) => {
    res.json(await editMessage(actorOf(req), chatMessageIdSchema.parse(req.params.messageId), chatMessageEditSchema.parse(req.body)));
  });
  router.delete('/messages/:messageId', async (req, res) => {
    res.json(await deleteMessage(actorOf(req), chatMessageIdSchema.parse(req.params.messageId)));
  });
  router.post('/messages/:messageId/hide', async (req, res) => {
    res.json(await hideMessage(actorOf(req), chatMessageIdSchema.parse(req.params.messageId), chatHideSchema.parse(req.body)));
  });
  router.put('/messages/:messageId/reactions/:reaction', async (req, res) => {
    res.json(await setReaction(actorOf(req), chatMessageIdSchema.parse(req.params.messageId), reactionSchema.parse(req.params.reaction), true));
  });
  router.delete('/messages/:messageId/reactions/:reaction', async (req, res) => {
    res.json(await setReaction(actorOf(req), chatMessageIdSchema.parse(req.params.messageId), reactionSchema.parse(req.params.reaction), false));
  });
  router.get('/search', async (req, res) => {
    res.json(await searchMessages(actorOf(req), chatSearchQuerySchema.parse(req.query)));
  });
  router.get('/mutes', async (req, res) => {
    res.json(await listMutes(actorOf(req)));
  });
  router.post('/mutes', async (req, res) => {
    res.status(201).json(await mutePerson(actorOf(req), chatMuteSchema.parse(req.body)));
  });
  router.delete('/mutes/:userId', async (req, res) => {
    res.json(await liftMute(actorOf(req), chatUserIdSchema.parse(req.params.userId)));
  });
  return router;
}

const threadRequest = z.strictObject({ threadId: chatThreadIdSchema });

/**
 * A socket joins a thread's room only after the same read check as an HTTP request for the thread, with
 * its payload validated the same way; leaving needs no check.
 */
export function registerChatSocketEvents(): void {
  onClientEvent(ClientEvent.chatJoin, async (user, payload, socket) => {
    const { threadId } = threadRequest.parse(payload);
    await mayJoinThread(user, threadId);
    await socket.join(rooms.chatThread(threadId));
  });
  onClientEvent(ClientEvent.chatLeave, async (_user, payload, socket) => {
    const { threadId } = threadRequest.parse(payload);
    await socket.leave(rooms.chatThread(threadId));
  });
}
