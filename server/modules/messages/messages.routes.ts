import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { historyQuerySchema, markReadSchema, openThreadSchema, sendMessageSchema } from '../../../shared/schemas/messages';
import type { Database } from '../../db/client';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { PostgresRateLimitStore } from '../../lib/rate-limit';
import type { RealtimeHub } from '../../realtime/hub';
import { jobForViewer } from '../jobs/jobs.service';
import { history, markRead, myThreads, openThread, sendMessage } from './messages.service';

const jobParams = z.object({ jobId: uuidSchema });
const threadParams = z.object({ threadId: uuidSchema });

/** Conversations over plain HTTP: the history, and a way to send and mark read without a socket. */
export function messagesRouter(deps: { db: Database; hub: RealtimeHub; messagesPer10s: number }) {
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
    const { totalHits } = await limiter.increment(user.id);
    if (totalHits > deps.messagesPer10s) throw new AppError('too_many_attempts', 'You are sending messages too fast. Wait a few seconds.', 429);
    const { message, duplicate, access } = await sendMessage(db, user, threadId, input);
    if (!duplicate) hub.messageCreated(message, [access.builderId, access.shopUserId].filter((id) => id !== user.id));
    res.status(duplicate ? 200 : 201).json({ message, duplicate });
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
