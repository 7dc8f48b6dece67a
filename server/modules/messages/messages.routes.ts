import type { RequestHandler } from 'express';
import { jobParamsSchema } from '../../../shared/schemas/jobs';
import { photoFileParamsSchema, uploadedPhotosSchema } from '../../../shared/schemas/photos';
import {
  historyPageSchema,
  historyQuerySchema,
  markedReadSchema,
  markReadSchema,
  MAX_PHOTOS_PER_MESSAGE,
  openThreadSchema,
  sendMessageSchema,
  sentMessageSchema,
  threadAnswerSchema,
  threadListSchema,
  threadParamsSchema,
} from '../../../shared/schemas/messages';
import { currentUser } from '../../lib/auth/guards';
import { routesFor } from '../../lib/http/routes';
import { photoUploadSteps, sendPhoto, uploadedFiles } from '../../lib/photo-upload';
import { addMessagePhotos, assertMaySendPhotos, readMessagePhoto, type MessagePhotoDeps } from './message-photos.service';
import { history, markRead, myThreads, openThread, sendMessage, threadsOfJob, type MessageDeps } from './messages.service';

/** The service's deps (with the message rate limit, built once per app and shared by every route here) and photo storage. */
export type MessagesRouteDeps = MessageDeps & MessagePhotoDeps & { uploadLimit: RequestHandler };

const photoParams = threadParamsSchema.extend(photoFileParamsSchema.shape);

/** Photos go up first (the browser shows each one's progress), then out with a message's photoIds. */
const photoUpload = (deps: MessagesRouteDeps) =>
  photoUploadSteps((req) => assertMaySendPhotos(deps.db, currentUser(req), threadParamsSchema.parse(req.params).threadId), deps.uploadLimit, MAX_PHOTOS_PER_MESSAGE);

const route = routesFor<MessagesRouteDeps>('Messages');

/** Conversations over plain HTTP: the history, photos for messages, and a way to send and mark read without a socket. */
export const messagesRoutes = [
  route({
    method: 'get',
    path: '/api/threads',
    summary: 'The signed-in person’s conversations with unread counts',
    access: 'signed-in',
    reply: { json: threadListSchema },
    handler: async ({ deps, user }) => ({ threads: await myThreads(deps.db, user) }),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/threads',
    summary: 'A job’s conversations the person may read',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: threadListSchema },
    handler: async ({ deps, user, params }) => ({ threads: await threadsOfJob(deps.db, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/threads',
    summary: 'Open (or find) the conversation between the job’s builder and a shop',
    access: 'builder or shop',
    params: jobParamsSchema,
    body: openThreadSchema,
    reply: { status: 201, json: threadAnswerSchema, description: 'The conversation' },
    handler: async ({ deps: { db }, user, params, body }) => {
      const thread = await openThread(db, user, params.jobId, body.shopId);
      const [summary] = (await myThreads(db, user, params.jobId)).filter((t) => t.id === thread.id);
      return { thread: summary };
    },
  }),
  route({
    method: 'get',
    path: '/api/threads/:threadId/messages',
    summary: 'Message history, newest first, paged by cursor',
    access: 'signed-in',
    params: threadParamsSchema,
    query: historyQuerySchema,
    reply: { json: historyPageSchema },
    handler: ({ deps, user, params, query }) => history(deps.db, user, params.threadId, query.before, query.limit),
  }),
  route({
    method: 'post',
    path: '/api/threads/:threadId/messages',
    summary: 'Send a message: words, up to 4 uploaded photos (photoIds), or both; a repeated clientId returns the stored one; live clients use the socket',
    access: 'builder or shop',
    params: threadParamsSchema,
    body: sendMessageSchema,
    reply: { status: 201, json: sentMessageSchema, description: 'Stored and delivered (200 with duplicate true: the message its clientId stored before)' },
    handler: async ({ deps, res, user, params, body }) => {
      const onTooFast = (seconds: number) => res.setHeader('Retry-After', String(seconds));
      const { message, duplicate } = await sendMessage(deps, user, params.threadId, body, { onTooFast });
      if (duplicate) res.status(200);
      return { message, duplicate };
    },
  }),
  route({
    method: 'post',
    path: '/api/threads/:threadId/photos',
    summary: 'Upload photos for a message (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 4 at a time); send their ids as the message’s photoIds',
    access: 'builder or shop',
    params: threadParamsSchema,
    use: photoUpload,
    reply: { status: 201, json: uploadedPhotosSchema, description: 'Stored, waiting for a message' },
    handler: async ({ deps, req, user, params }) => ({ photos: await addMessagePhotos(deps, user, params.threadId, uploadedFiles(req)) }),
  }),
  route({
    method: 'get',
    path: '/api/threads/:threadId/photos/:photoId/:size',
    summary: 'A photo in a conversation, re-encoded as WebP (before it is sent, only for its uploader)',
    access: 'signed-in',
    params: photoParams,
    reply: { file: 'image/webp', description: 'The photo as WebP' },
    handler: async ({ deps, res, user, params }) => sendPhoto(res, await readMessagePhoto(deps, user, params.threadId, params.photoId, params.size)),
  }),
  route({
    method: 'post',
    path: '/api/threads/:threadId/read',
    summary: 'Mark the conversation read up to a message',
    access: 'signed-in',
    params: threadParamsSchema,
    body: markReadSchema,
    reply: { json: markedReadSchema },
    handler: async ({ deps, user, params, body }) => {
      await markRead(deps, user, params.threadId, body.messageId);
      return { messageId: body.messageId };
    },
  }),
];
