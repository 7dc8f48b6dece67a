import { z } from 'zod';
import { jobParamsSchema } from '../../../shared/schemas/jobs';
import {
  acceptInspectionSchema,
  draftSavedSchema,
  inspectionDraftSchema,
  inspectionInputSchema,
  inspectionVersionAnswerSchema,
  inspectionViewSchema,
  rejectInspectionSchema,
} from '../../../shared/schemas/inspection';
import { sendDownload } from '../../lib/http/download';
import { routesFor } from '../../lib/http/routes';
import { acceptInspection, certificateFor, inspectionView, rejectInspection, saveDraft, submitInspection, type InspectionDeps } from './inspections.service';

const route = routesFor<InspectionDeps>('Work');

/** The inspection record: the shop's readings and the builder's answer. */
export const inspectionsRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/inspection',
    summary: 'Inspection record versions with the server’s results, the shop’s draft, and the review deadline',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: inspectionViewSchema },
    handler: ({ deps, user, params }) => inspectionView(deps.db, user, params.jobId),
  }),
  route({
    method: 'put',
    path: '/api/jobs/:jobId/inspection/draft',
    summary: 'Keep the shop’s unfinished record',
    access: 'shop',
    params: jobParamsSchema,
    body: inspectionDraftSchema,
    reply: { json: draftSavedSchema, description: 'Kept' },
    handler: ({ deps, user, params, body }) => saveDraft(deps.db, user, params.jobId, body.draft),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/inspection',
    summary: 'Submit the measured record (raw readings only; the server computes and judges)',
    access: 'shop',
    params: jobParamsSchema,
    // Only the raw readings are read; any computed figures a client sends are not part of the schema and are dropped.
    body: inspectionInputSchema,
    reply: { status: 201, json: inspectionVersionAnswerSchema, description: 'A new version' },
    handler: async ({ deps, user, params, body }) => ({ version: await submitInspection(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/inspection/accept',
    summary: 'Accept one version of the record, naming each check that does not conform: the held payment is released to the shop',
    access: 'builder',
    params: jobParamsSchema,
    body: acceptInspectionSchema,
    reply: { json: inspectionVersionAnswerSchema, description: 'Accepted' },
    handler: async ({ deps, user, params, body }) => ({ version: await acceptInspection(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/inspection/reject',
    summary: 'Ask for changes to one version of the record, with reasons (another version waiting is refused); the shop submits a new version',
    access: 'builder',
    params: jobParamsSchema,
    body: rejectInspectionSchema,
    reply: { json: inspectionVersionAnswerSchema, description: 'Rejected' },
    handler: async ({ deps, user, params, body }) => ({ version: await rejectInspection(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/inspection/:version/certificate.pdf',
    summary: 'The certificate of one version as a PDF',
    access: 'signed-in',
    params: jobParamsSchema.extend({ version: z.coerce.number().int().min(1).max(1000) }),
    reply: { file: 'application/pdf', description: 'The certificate' },
    handler: async ({ deps, user, params: { jobId, version }, res }) => {
      sendDownload(res, { type: 'application/pdf', filename: `inspection-record-v${version}.pdf`, body: await certificateFor(deps, user, jobId, version) });
    },
  }),
];
