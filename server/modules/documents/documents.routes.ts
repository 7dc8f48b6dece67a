import type { Response } from 'express';
import { z } from 'zod';
import { bidParamsSchema } from '../../../shared/schemas/bids';
import { uuidSchema } from '../../../shared/schemas/common';
import { jobParamsSchema } from '../../../shared/schemas/jobs';
import { sendDownload } from '../../lib/http/download';
import { routesFor } from '../../lib/http/routes';
import { invoiceFor, quoteFor, receiptFor, type DocumentDeps } from './documents.service';

/** A document sent as a download. */
const sendPdf = (res: Response, filename: string, pdf: Buffer) => sendDownload(res, { type: 'application/pdf', filename, body: pdf });

const route = routesFor<DocumentDeps>('Documents');

/** Printable money documents: a receipt per payment, an invoice per finished job, a quote per bid. */
export const documentsRoutes = [
  route({
    method: 'get',
    path: '/api/payments/:paymentId/receipt.pdf',
    summary: 'The numbered receipt of a payment (the builder who paid and admins)',
    access: 'signed-in',
    params: z.object({ paymentId: uuidSchema }),
    reply: { file: 'application/pdf', description: 'The receipt' },
    handler: async ({ deps, user, params, res }) => receiptFor(deps, user, params.paymentId).then(({ number, pdf }) => sendPdf(res, `tenthmark-receipt-${number}.pdf`, pdf)),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/invoice.pdf',
    summary: 'The shop’s numbered invoice for a finished job (fee and net payout on the shop’s copy)',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { file: 'application/pdf', description: 'The invoice' },
    handler: async ({ deps, user, params, res }) => invoiceFor(deps, user, params.jobId).then(({ number, pdf }) => sendPdf(res, `tenthmark-invoice-${number}.pdf`, pdf)),
  }),
  route({
    method: 'get',
    path: '/api/bids/:bidId/quote.pdf',
    summary: 'A bid as the shop’s quote',
    access: 'signed-in',
    params: bidParamsSchema,
    reply: { file: 'application/pdf', description: 'The quote' },
    handler: async ({ deps, user, params, res }) => sendPdf(res, `tenthmark-quote-${params.bidId.slice(0, 8)}.pdf`, await quoteFor(deps, user, params.bidId)),
  }),
];
