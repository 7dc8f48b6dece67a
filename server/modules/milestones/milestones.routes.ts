import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { MAX_PHOTOS_PER_MILESTONE, milestoneInputSchema, type UploadedMilestonePhotos } from '../../../shared/schemas/inspection';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { receivePhotos, uploadedFiles } from '../../lib/photo-upload';
import type { FileStorage } from '../../lib/storage';
import { addMilestonePhotos, assertMayUploadMilestonePhotos, readMilestonePhoto } from './milestone-photos';
import { listMilestones, logMilestone, type MilestoneDeps } from './milestones.service';

const jobParams = z.object({ jobId: uuidSchema });
const milestonePhotoParams = z.object({ jobId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' }) });

/** Milestones: the shop's log of progress on the job, with photos. */
export function milestonesRouter(deps: MilestoneDeps & { storage?: FileStorage; uploadLimit: RequestHandler }) {
  const router = Router();
  const storage = (): FileStorage => {
    if (!deps.storage) throw new AppError('unavailable', 'Photo storage is not set up.', 503);
    return deps.storage;
  };

  // Photos go up first (the browser shows each one's progress), then out with a milestone's photoIds.
  const mayUpload: RequestHandler = async (req, _res, next) => {
    await assertMayUploadMilestonePhotos(deps.db, currentUser(req), jobParams.parse(req.params).jobId);
    next();
  };
  router.post('/jobs/:jobId/milestone-photos', requireRole('shop'), mayUpload, deps.uploadLimit, receivePhotos(MAX_PHOTOS_PER_MILESTONE), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const photos = await addMilestonePhotos({ db: deps.db, storage: storage() }, currentUser(req), jobId, uploadedFiles(req));
    res.status(201).json({ photos } satisfies UploadedMilestonePhotos);
  });

  router.get('/jobs/:jobId/milestone-photos/:photoId/:size', requireUser, async (req, res) => {
    const { jobId, photoId, size } = milestonePhotoParams.parse(req.params);
    const data = await readMilestonePhoto({ db: deps.db, storage: storage() }, currentUser(req), jobId, photoId, size);
    res.set({ 'Content-Type': 'image/webp', 'Cache-Control': 'private, max-age=3600', 'X-Content-Type-Options': 'nosniff' }).send(data);
  });

  router.get('/jobs/:jobId/milestones', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json({ milestones: await listMilestones(deps.db, currentUser(req), jobId) });
  });

  router.post('/jobs/:jobId/milestones', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.status(201).json({ milestone: await logMilestone(deps, currentUser(req), jobId, milestoneInputSchema.parse(req.body)) });
  });

  return router;
}
