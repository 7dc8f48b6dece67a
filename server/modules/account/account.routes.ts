import type { Request } from 'express';
import {
  accountDeletedSchema,
  accountExportSchema,
  changeEmailSchema,
  confirmEmailChangeSchema,
  deleteAccountSchema,
  deletionCheckSchema,
  emailChangedSchema,
  emailChangeRequestedSchema,
} from '../../../shared/schemas/account';
import type { Database } from '../../db/client';
import { routesFor } from '../../lib/http/routes';
import type { RealtimeHub } from '../../realtime/hub';
import type { AppConfig } from '../../env';
import { passwordChangeLimits, signOutHere } from '../auth/auth.routes';
import { accountCsv, accountExport, confirmEmailChange, deleteAccount, deletionCheck, requestEmailChange } from './account.service';

export interface AccountRouteDeps {
  db: Database;
  appUrl: string;
  hub: RealtimeHub;
  sessionCookieName: string;
  rateLimits: AppConfig['rateLimits'];
}

const route = routesFor<AccountRouteDeps>('Account');

const today = () => new Date().toISOString().slice(0, 10);
const attachment = (req: Request, name: string) => `attachment; filename="tenthmark-${name}-${today()}.${req.path.endsWith('.csv') ? 'csv' : 'json'}"`;

/** The signed-in person's own account: a new e-mail address, their data to take away, deleting the account. */
export const accountRoutes = [
  route({
    method: 'post',
    path: '/api/me/email',
    summary: 'Ask to move the account to a new e-mail address (the current password proves it is you); a link goes to the new address',
    access: 'signed-in',
    body: changeEmailSchema,
    // Wrong current passwords count with those of the password change.
    use: passwordChangeLimits,
    reply: { status: 202, json: emailChangeRequestedSchema, description: 'The link is on its way; the address changes when it is followed' },
    handler: async ({ deps, user, body }) => ({ pendingEmail: await requestEmailChange(deps, user, body) }),
  }),
  route({
    method: 'post',
    path: '/api/me/email/confirm',
    summary: 'Move the account to the new address with the link mailed there',
    // The link may be opened signed out, or in another browser: the token is the proof.
    access: 'public',
    body: confirmEmailChangeSchema,
    reply: { json: emailChangedSchema, description: 'The account uses the new address' },
    handler: async ({ deps, body }) => ({ email: await confirmEmailChange(deps, body.token), changed: true as const }),
  }),
  route({
    method: 'get',
    path: '/api/me/export',
    summary: 'Everything kept about you and the jobs you took part in, as JSON',
    access: 'signed-in',
    reply: { json: accountExportSchema, description: 'Your data' },
    handler: async ({ deps, req, res, user }) => {
      res.setHeader('Content-Disposition', attachment(req, 'my-data'));
      return accountExport(deps, user);
    },
  }),
  route({
    method: 'get',
    path: '/api/me/export.csv',
    summary: 'Your jobs and the money lines about them, as one CSV',
    access: 'signed-in',
    reply: { file: 'text/csv', description: 'One row per job and per money line' },
    handler: async ({ deps, req, res, user }) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', attachment(req, 'my-jobs-and-money'));
      res.send(await accountCsv(deps, user));
    },
  }),
  route({
    method: 'get',
    path: '/api/me/deletion',
    summary: 'Whether the account can be deleted now, and what stands in the way',
    access: 'signed-in',
    reply: { json: deletionCheckSchema, description: 'What must be settled first' },
    handler: ({ deps, user }) => deletionCheck(deps, user),
  }),
  route({
    method: 'post',
    path: '/api/me/delete',
    summary: 'Delete the account (the current password proves it is you); every session ends',
    access: 'signed-in',
    body: deleteAccountSchema,
    use: passwordChangeLimits,
    reply: { json: accountDeletedSchema, description: 'Deleted and signed out' },
    handler: async ({ deps, req, res, user, body }) => {
      await deleteAccount(deps, user, body.currentPassword);
      await signOutHere(deps, req, res);
      return { deleted: true as const };
    },
  }),
];
