import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { boardQuerySchema, jobInputSchema, myJobsQuerySchema } from '../../../shared/schemas/jobs';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { receivePhotos } from '../../lib/photo-upload';
import { boardPage, jobsOfBuilder } from './jobs.repository';
import {
  addPhotos,
  assertMayAddPhotos,
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

const jobParams = z.object({ jobId: uuidSchema });
const photoParams = z.object({ jobId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' }) });

export function jobsRouter(deps: JobDeps & { uploadLimit: RequestHandler }) {
  const router = Router();

  router.get('/jobs', requireRole('shop', 'admin'), async (req, res) => {
    res.json(await boardPage(deps.db, boardQuerySchema.parse(req.query)));
  });

  router.get('/jobs/mine', requireRole('builder'), async (req, res) => {
    const { status } = myJobsQuerySchema.parse(req.query);
    res.json({ jobs: await jobsOfBuilder(deps.db, currentUser(req).id, status) });
  });

  router.post('/jobs', requireRole('builder'), async (req, res) => {
    const job = await createJob(deps, currentUser(req), jobInputSchema.parse(req.body));
    res.status(201).json({ job: await jobDetail(deps, job, currentUser(req)) });
  });

  router.get('/jobs/:jobId', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json({ job: await jobDetailFor(deps, currentUser(req), jobId) });
  });

  router.put('/jobs/:jobId', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const job = await updateJob(deps, currentUser(req), jobId, jobInputSchema.parse(req.body));
    res.json({ job: await jobDetail(deps, job, currentUser(req)) });
  });

  router.post('/jobs/:jobId/publish', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const job = await publishJob(deps, currentUser(req), jobId);
    res.json({ job: await jobDetail(deps, job, currentUser(req)) });
  });

  router.post('/jobs/:jobId/cancel', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const job = await cancelJob(deps, currentUser(req), jobId);
    res.json({ job: await jobDetail(deps, job, currentUser(req)) });
  });

  // Who may upload is settled before the body is read; the photos are decoded only after that.
  const mayUpload: RequestHandler = async (req, _res, next) => {
    await assertMayAddPhotos(deps.db, currentUser(req), jobParams.parse(req.params).jobId);
    next();
  };
  router.post('/jobs/:jobId/photos', requireRole('builder'), mayUpload, deps.uploadLimit, receivePhotos(MAX_PHOTOS_PER_JOB), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const files = (req.files as Express.Multer.File[] | undefined) ?? [];
    const photos = await addPhotos(deps, currentUser(req), jobId, files);
    res.status(201).json({ photos });
  });

  router.get('/jobs/:jobId/photos/:photoId/:size', requireUser, async (req, res) => {
    const { jobId, photoId, size } = photoParams.parse(req.params);
    const data = await readPhoto(deps, currentUser(req), jobId, photoId, size);
    res.set({ 'Content-Type': 'image/webp', 'Cache-Control': 'private, max-age=3600', 'X-Content-Type-Options': 'nosniff' }).send(data);
  });

  router.delete('/jobs/:jobId/photos/:photoId', requireRole('builder'), async (req, res) => {
    const { jobId, photoId } = photoParams.omit({ size: true }).parse(req.params);
    await removePhoto(deps, currentUser(req), jobId, photoId);
    res.status(204).end();
  });

  return router;
}
