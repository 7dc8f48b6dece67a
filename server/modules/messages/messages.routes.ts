import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import {
  historyQuerySchema,
  markReadSchema,
  MAX_PHOTOS_PER_MESSAGE,
  openThreadSchema,
  sendMessageSchema,
  type UploadedMessagePhotos,
} from '../../../shared/schemas/messages';
import type { Database } from '../../db/client';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { receivePhotos, uploadedFiles } from '../../lib/photo-upload';
import type { FileStorage } from '../../lib/storage';
import type { RealtimeHub } from '../../realtime/hub';
import { addMessagePhotos, assertMaySendPhotos, readMessagePhoto } from './message-photos.service';
import { history, markRead, messageRateLimit, myThreads, openThread, sendMessage, threadsOfJob } from './messages.service';

const jobParams = z.object({ jobId: uuidSchema });
const threadParams = z.object({ threadId: uuidSchema });
const photoParams = z.object({ threadId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' }) });

/** Conversations over plain HTTP: the history, photos for messages, and a way to send and mark read without a socket. */
export function messagesRouter(deps: { db: Database; hub: RealtimeHub; storage: FileStorage; messagesPer10s: number; uploadLimit: RequestHandler }) {
  const { db } = deps;
  const router = Router();
  const messageDeps = { db, hub: deps.hub, rateLimit: messageRateLimit(db, deps.messagesPer10s) };

  router.get('/threads', requireUser, async (req, res) => {
    res.json({ threads: await myThreads(db, currentUser(req)) });
  });

  router.get('/jobs/:jobId/threads', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json({ threads: await threadsOfJob(db, currentUser(req), jobId) });
  });

  router.post('/jobs/:jobId/threads', requireRole('builder', 'shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { shopId } = openThreadSchema.parse(req.body);
    const thread = await openThread(db, currentUser(req), jobId, shopId);
    const [summary] = (await myThreads(db, currentUser(req), jobId)).filter((t) => t.id === thread.id);
    res.status(201).json({ thread: summary });
  });

  router.get('/threads/:threadId/messages', requireUser, async (req, res) => {
    const { threadId } = threadParams.parse(req.params);
    const { before, limit } = historyQuerySchema.parse(req.query);
    res.json(await history(db, currentUser(req), threadId, before, limit));
  });

  router.post('/threads/:threadId/messages', requireRole('builder', 'shop'), async (req, res) => {
    const { threadId } = threadParams.parse(req.params);
    const input = sendMessageSchema.parse(req.body);
    const onTooFast = (seconds: number) => res.setHeader('Retry-After', String(seconds));
    const { message, duplicate } = await sendMessage(messageDeps, currentUser(req), threadId, input, { onTooFast });
    res.status(duplicate ? 200 : 201).json({ message, duplicate });
  });

  // Photos go up first (the browser shows each one's progress), then out with a message's photoIds.
  const mayUpload: RequestHandler = async (req, _res, next) => {
    await assertMaySendPhotos(db, currentUser(req), threadParams.parse(req.params).threadId);
    next();
  };
  router.post('/threads/:threadId/photos', requireRole('builder', 'shop'), mayUpload, deps.uploadLimit, receivePhotos(MAX_PHOTOS_PER_MESSAGE), async (req, res) => {
    const { threadId } = threadParams.parse(req.params);
    const photos = await addMessagePhotos(deps, currentUser(req), threadId, uploadedFiles(req));
    res.status(201).json({ photos } satisfies UploadedMessagePhotos);
  });

  router.get('/threads/:threadId/photos/:photoId/:size', requireUser, async (req, res) => {
    const { threadId, photoId, size } = photoParams.parse(req.params);
    const data = await readMessagePhoto(deps, currentUser(req), threadId, photoId, size);
    res.set({ 'Content-Type': 'image/webp', 'Cache-Control': 'private, max-age=3600', 'X-Content-Type-Options': 'nosniff' }).send(data);
  });

  router.post('/threads/:threadId/read', requireUser, async (req, res) => {
    const { threadId } = threadParams.parse(req.params);
    const { messageId } = markReadSchema.parse(req.body);
    await markRead(messageDeps, currentUser(req), threadId, messageId);
    res.json({ messageId });
  });

  return router;
}
