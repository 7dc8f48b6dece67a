import { contactAnswerSchema } from '../../../shared/schemas/help';
import { routesFor } from '../../lib/http/routes';

const route = routesFor<{ supportEmail: string }>('Help');

/** How to reach us, for the help page and for anyone who cannot sign in (a suspended account). */
export const helpRoutes = [
  route({
    method: 'get',
    path: '/api/help/contact',
    summary: 'The e-mail address that reaches Tenthmark’s people',
    access: 'public',
    reply: { json: contactAnswerSchema },
    handler: ({ deps }) => ({ email: deps.supportEmail }),
  }),
];
