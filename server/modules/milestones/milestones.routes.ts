import type { RequestHandler } from 'express';
import { MAX_PHOTOS_PER_MILESTONE, milestoneInputSchema } from '../../../shared/schemas/inspection';
import { jobParamsSchema, jobPhotoFileParamsSchema } from '../../../shared/schemas/jobs';
import { milestoneAnswerSchema, milestoneListSchema } from '../../../shared/schemas/milestones';
import { uploadedPhotosSchema } from '../../../shared/schemas/photos';
import { currentUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { routesFor } from '../../lib/http/routes';
import { photoUploadSteps, sendPhoto, uploadedFiles } from '../../lib/photo-upload';
import type { FileStorage } from '../../lib/storage';
import { addMilestonePhotos, assertMayUploadMilestonePhotos, readMilestonePhoto } from './milestone-photos';
import { listMilestones, logMilestone, type MilestoneDeps } from './milestones.service';

export type MilestonesRouteDeps = MilestoneDeps & { storage?: FileStorage; uploadLimit: RequestHandler };


function photoDeps(deps: MilestonesRouteDeps) {
  if (!deps.storage) throw new AppError('unavailable', 'Photo storage is not set up.', 503);
  return { db: deps.db, storage: deps.storage };
}

/** Photos go up first (the browser shows each one's progress), then out with a milestone's photoIds. */
const photoUpload = (deps: MilestonesRouteDeps) =>
  photoUploadSteps((req) => assertMayUploadMilestonePhotos(deps.db, currentUser(req), jobParamsSchema.parse(req.params).jobId), deps.uploadLimit, MAX_PHOTOS_PER_MILESTONE);

const route = routesFor<MilestonesRouteDeps>('Work');

/** Milestones: the shop's log of progress on the job, with photos. */
export const milestonesRoutes = [
  route({
    method: 'post',
    path: '/api/jobs/:jobId/milestone-photos',
    summary: 'The working shop uploads photos for a milestone (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 4 at a time); send their ids as the milestone’s photoIds',
    access: 'shop',
    params: jobParamsSchema,
    use: photoUpload,
    reply: { status: 201, json: uploadedPhotosSchema, description: 'Stored, waiting for a milestone' },
    handler: async ({ deps, req, user, params }) => ({ photos: await addMilestonePhotos(photoDeps(deps), user, params.jobId, uploadedFiles(req)) }),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/milestone-photos/:photoId/:size',
    summary: 'A milestone photo, re-encoded as WebP (before it is attached, only for its uploader)',
    access: 'signed-in',
    params: jobPhotoFileParamsSchema,
    reply: { file: 'image/webp', description: 'The photo as WebP' },
    handler: async ({ deps, res, user, params }) => sendPhoto(res, await readMilestonePhoto(photoDeps(deps), user, params.jobId, params.photoId, params.size)),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/milestones',
    summary: 'The job’s progress timeline',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: milestoneListSchema },
    handler: async ({ deps, user, params }) => ({ milestones: await listMilestones(deps.db, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/milestones',
    summary: 'The working shop logs progress (parts received starts the work)',
    access: 'shop',
    params: jobParamsSchema,
    body: milestoneInputSchema,
    reply: { status: 201, json: milestoneAnswerSchema, description: 'Logged' },
    handler: async ({ deps, user, params, body }) => ({ milestone: await logMilestone(deps, user, params.jobId, body) }),
  }),
];
