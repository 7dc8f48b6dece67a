import type { RequestHandler } from 'express';
import { uuidSchema } from '../../../shared/schemas/common';
import {
  boardPageSchema,
  boardQuerySchema,
  jobAnswerSchema,
  jobInputSchema,
  jobListAnswerSchema,
  jobParamsSchema,
  jobPhotoFileParamsSchema,
  jobPhotosAnswerSchema,
  myJobsQuerySchema,
} from '../../../shared/schemas/jobs';
import { currentUser } from '../../lib/auth/guards';
import { routesFor } from '../../lib/http/routes';
import { photoUploadSteps, sendPhoto, uploadedFiles } from '../../lib/photo-upload';
import type { User } from '../../db/schema';
import { jobsOfBuilder, type JobRow } from './jobs.repository';
import {
  addPhotos,
  assertMayAddPhotos,
  boardFor,
  cancelJob,
  createJob,
  jobDetail,
  jobDetailFor,
  MAX_PHOTOS_PER_JOB,
  publishJob,
  readPhoto,
  removePhoto,
  updateJob,
  type JobDeps,
} from './jobs.service';

type JobRouteDeps = JobDeps & { uploadLimit: RequestHandler };

const photoParams = jobParamsSchema.extend({ photoId: uuidSchema });

/** Who may upload is settled before the body is read, so a refused upload is never read. */
const photoUpload = (deps: JobRouteDeps) =>
  photoUploadSteps((req) => assertMayAddPhotos(deps.db, currentUser(req), jobParamsSchema.parse(req.params).jobId), deps.uploadLimit, MAX_PHOTOS_PER_JOB);

/** The job a change left, as the person who made the change now sees it. */
const answerJob = async (deps: JobDeps, user: User, change: Promise<JobRow>) => ({ job: await jobDetail(deps, await change, user) });

const route = routesFor<JobRouteDeps>('Jobs');

/** The job board, a builder's jobs, and a job's life from draft to cancelled, with its photos. */
export const jobsRoutes = [
  route({
    method: 'get',
    path: '/api/jobs',
    summary: 'The job board: open jobs, filtered, sorted and paged',
    access: 'shop or admin',
    query: boardQuerySchema,
    reply: { json: boardPageSchema },
    handler: ({ deps, user, query }) => boardFor(deps, user, query),
  }),
  route({
    method: 'get',
    path: '/api/jobs/mine',
    summary: 'The signed-in builder’s jobs',
    access: 'builder',
    query: myJobsQuerySchema,
    reply: { json: jobListAnswerSchema },
    handler: async ({ deps, user, query }) => ({ jobs: await jobsOfBuilder(deps.db, user.id, query.status) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs',
    summary: 'Create a draft job',
    access: 'builder',
    body: jobInputSchema,
    reply: { status: 201, description: 'Draft created', json: jobAnswerSchema },
    handler: ({ deps, user, body }) => answerJob(deps, user, createJob(deps, user, body)),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId',
    summary: 'A job, for its builder, shops while open, and shops that bid',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: jobAnswerSchema },
    handler: async ({ deps, user, params }) => ({ job: await jobDetailFor(deps, user, params.jobId) }),
  }),
  route({
    method: 'put',
    path: '/api/jobs/:jobId',
    summary: 'Edit a draft or open job (bidders are told)',
    access: 'builder',
    params: jobParamsSchema,
    body: jobInputSchema,
    reply: { json: jobAnswerSchema },
    handler: ({ deps, user, params, body }) => answerJob(deps, user, updateJob(deps, user, params.jobId, body)),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/publish',
    summary: 'Publish a draft to the board',
    access: 'builder',
    params: jobParamsSchema,
    reply: { json: jobAnswerSchema },
    handler: ({ deps, user, params }) => answerJob(deps, user, publishJob(deps, user, params.jobId)),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/cancel',
    summary: 'Cancel a job before payment (an open payment page for it is expired)',
    access: 'builder',
    params: jobParamsSchema,
    reply: { json: jobAnswerSchema },
    handler: ({ deps, user, params }) => answerJob(deps, user, cancelJob(deps, user, params.jobId)),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/photos',
    summary: 'Upload photos (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 12 per job)',
    access: 'builder',
    params: jobParamsSchema,
    use: photoUpload,
    reply: { status: 201, description: 'Stored', json: jobPhotosAnswerSchema },
    handler: async ({ deps, req, user, params }) => ({ photos: await addPhotos(deps, user, params.jobId, uploadedFiles(req)) }),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/photos/:photoId/:size',
    summary: 'A photo, re-encoded as WebP',
    access: 'signed-in',
    params: jobPhotoFileParamsSchema,
    reply: { file: 'image/webp', description: 'image/webp' },
    handler: async ({ deps, res, user, params }) => sendPhoto(res, await readPhoto(deps, user, params.jobId, params.photoId, params.size)),
  }),
  route({
    method: 'delete',
    path: '/api/jobs/:jobId/photos/:photoId',
    summary: 'Remove a photo',
    access: 'builder',
    params: photoParams,
    reply: { status: 204, empty: true, description: 'Removed' },
    handler: ({ deps, user, params }) => removePhoto(deps, user, params.jobId, params.photoId),
  }),
];
