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
import { AppError } from '../../lib/errors';
import { receivePhotos, uploadedFiles } from '../../lib/photo-upload';
import { PostgresRateLimitStore } from '../../lib/rate-limit';
import type { FileStorage } from '../../lib/storage';
import type { RealtimeHub } from '../../realtime/hub';
import { jobForViewer } from '../jobs/jobs.service';
import { addMessagePhotos, assertMaySendPhotos, readMessagePhoto } from './message-photos.service';
import { history, markRead, myThreads, openThread, sendMessage } from './messages.service';

const jobParams = z.object({ jobId: uuidSchema });
const threadParams = z.object({ threadId: uuidSchema });
const photoParams = z.object({ threadId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' }) });

/** Conversations over plain HTTP: the history, photos for messages, and a way to send and mark read without a socket. */
export function messagesRouter(deps: { db: Database; hub: RealtimeHub; storage: FileStorage; messagesPer10s: number; uploadLimit: RequestHandler }) {
  const { db, hub } = deps;
  const router = Router();
  const limiter = new PostgresRateLimitStore(db, 'messages');
  limiter.init({ windowMs: 10_000 } as never);

  router.get('/threads', requireUser, async (req, res) => {
    res.json({ threads: await myThreads(db, currentUser(req)) });
  });

  router.get('/jobs/:jobId/threads', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    await jobForViewer(db, jobId, currentUser(req));
    res.json({ threads: await myThreads(db, currentUser(req), jobId) });
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
    const user = currentUser(req);
    const { totalHits, resetTime } = await limiter.increment(user.id);
    if (totalHits > deps.messagesPer10s) {
      res.setHeader('Retry-After', String(Math.max(1, Math.ceil(((resetTime?.getTime() ?? Date.now()) - Date.now()) / 1000))));
      throw new AppError('too_many_attempts', 'You are sending messages too fast. Wait a few seconds.', 429);
    }
    const { message, duplicate, access } = await sendMessage(db, user, threadId, input);
    if (!duplicate) hub.messageCreated(message, [access.builderId, access.shopUserId].filter((id) => id !== user.id));
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
    await markRead(db, currentUser(req), threadId, messageId);
    hub.readMoved(threadId, currentUser(req).id, messageId);
    res.json({ messageId });
  });

  return router;
}
