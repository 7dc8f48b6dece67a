import { z } from 'zod';
import { measurementKinds } from '../measurement-sheets';
import { operationCodeSchema } from './common';

/** One operation of the catalogue with what its inspection sheet measures (GET /api/catalogue). */
export const catalogueOperationSchema = z.object({
  code: operationCodeSchema,
  name: z.string(),
  description: z.string(),
  pricedPer: z.enum(['cylinder', 'part', 'job']),
  part: z.enum(['block', 'head', 'crank', 'rotating']),
  measurements: z.array(z.object({ key: z.string(), label: z.string(), kind: z.enum(measurementKinds) })),
});

export const catalogueAnswerSchema = z.object({ operations: z.array(catalogueOperationSchema) });
export type CatalogueAnswer = z.infer<typeof catalogueAnswerSchema>;
