import type { PendingGithub } from '../shared/schemas/auth';
import type { User as UserRow } from './db/schema';

declare global {
  namespace Express {
    // passport puts the signed-in user's row on req.user
    interface User extends UserRow {}
  }
}

declare module 'express-session' {
  interface SessionData {
    pendingGithub?: PendingGithub & { githubId: string };
    /** Where to go after a GitHub sign-in; always one of our own paths. */
    returnTo?: string;
  }
}

export {};
