import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import {
  inspectionDraftSchema,
  inspectionInputSchema,
  MAX_PHOTOS_PER_MILESTONE,
  milestoneInputSchema,
  rejectInspectionSchema,
  type UploadedMilestonePhotos,
} from '../../../shared/schemas/inspection';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { receivePhotos, uploadedFiles } from '../../lib/photo-upload';
import type { FileStorage } from '../../lib/storage';
import { addMilestonePhotos, assertMayUploadMilestonePhotos, readMilestonePhoto } from '../milestones/milestone-photos';
import { listMilestones, logMilestone } from '../milestones/milestones.service';
import { acceptInspection, certificateFor, inspectionView, rejectInspection, saveDraft, submitInspection, type InspectionDeps } from './inspections.service';

const jobParams = z.object({ jobId: uuidSchema });
const milestonePhotoParams = z.object({ jobId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' }) });

/** Milestones and the inspection record: the shop's proof of work and the builder's answer. */
export function workRouter(deps: InspectionDeps & { storage?: FileStorage; uploadLimit: RequestHandler }) {
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
    await logMilestone(deps.db, currentUser(req), jobId, milestoneInputSchema.parse(req.body));
    deps.hub?.jobChanged(jobId, 'job_updated');
    const all = await listMilestones(deps.db, currentUser(req), jobId);
    res.status(201).json({ milestone: all[all.length - 1] });
  });

  router.get('/jobs/:jobId/inspection', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await inspectionView(deps.db, currentUser(req), jobId));
  });

  router.put('/jobs/:jobId/inspection/draft', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { draft } = inspectionDraftSchema.parse(req.body);
    res.json(await saveDraft(deps.db, currentUser(req), jobId, draft));
  });

  router.post('/jobs/:jobId/inspection', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    // Only the raw readings are read; any computed figures a client sends are not part of the schema and are dropped.
    const version = await submitInspection(deps, currentUser(req), jobId, inspectionInputSchema.parse(req.body));
    deps.hub?.jobChanged(jobId, 'job_updated');
    res.status(201).json({ version });
  });

  router.post('/jobs/:jobId/inspection/accept', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json({ version: await acceptInspection(deps, currentUser(req), jobId) });
  });

  router.post('/jobs/:jobId/inspection/reject', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { reasons } = rejectInspectionSchema.parse(req.body);
    const version = await rejectInspection(deps, currentUser(req), jobId, reasons);
    deps.hub?.jobChanged(jobId, 'job_updated');
    res.json({ version });
  });

  router.get('/jobs/:jobId/inspection/:version/certificate.pdf', requireUser, async (req, res) => {
    const { jobId, version } = jobParams.extend({ version: z.coerce.number().int().min(1).max(1000) }).parse(req.params);
    const pdf = await certificateFor(deps.db, currentUser(req), jobId, version);
    res
      .set({ 'Content-Type': 'application/pdf', 'Content-Disposition': `attachment; filename="inspection-record-v${version}.pdf"`, 'Cache-Control': 'private, no-store' })
      .send(pdf);
  });

  return router;
}
