import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { inspectionDraftSchema, inspectionInputSchema, rejectInspectionSchema } from '../../../shared/schemas/inspection';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { acceptInspection, certificateFor, inspectionView, rejectInspection, saveDraft, submitInspection, type InspectionDeps } from './inspections.service';

const jobParams = z.object({ jobId: uuidSchema });

/** The inspection record: the shop's readings and the builder's answer. */
export function inspectionsRouter(deps: InspectionDeps) {
  const router = Router();
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
