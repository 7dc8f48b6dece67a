import { catalogueWithSheets } from '../../../shared/measurement-sheets';
import { catalogueAnswerSchema } from '../../../shared/schemas/catalogue';
import { routesFor } from '../../lib/http/routes';

const route = routesFor<Record<string, never>>('Catalogue');

/** The work a builder can order, each with the measurements its inspection record takes. */
export const catalogueRoutes = [
  route({
    method: 'get',
    path: '/api/catalogue',
    summary: 'The operations a job can order, each with its inspection sheet (what is measured, and its kind)',
    access: 'public',
    reply: { json: catalogueAnswerSchema },
    handler: () => ({ operations: catalogueWithSheets() }),
  }),
];
