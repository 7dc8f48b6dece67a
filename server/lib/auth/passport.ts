import type { Request } from 'express';
import { Passport } from 'passport';
import { Strategy as GitHubStrategy, type Profile as GitHubProfile } from 'passport-github2';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Database } from '../../db/client';
import type { GithubConfig } from '../../env';
import { authenticate, type GithubProfile } from '../../modules/auth/auth.service';
import { findUserById } from '../../modules/users/users.repository';
import { userReadWithSession } from '../session-store';

interface RawEmail {
  value: string;
  primary?: boolean;
  verified?: boolean;
}

/** Only a primary address that GitHub marks verified is taken as the person's e-mail. */
export function toGithubProfile(profile: GitHubProfile): GithubProfile {
  const emails = (profile.emails ?? []) as RawEmail[];
  const primary = emails.find((e) => e.primary && e.verified);
  return {
    githubId: String(profile.id),
    login: profile.username ?? String(profile.id),
    displayName: (profile.displayName || profile.username || 'GitHub user').slice(0, 80),
    email: primary?.value,
  };
}

/** One passport instance per app, so several apps in one process do not share strategies. */
export function createPassport(deps: { db: Database; appUrl: string; github: GithubConfig }) {
  const passport = new Passport();

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      authenticate(deps, email, password).then(
        (user) => done(null, user),
        (error) => done(error),
      );
    }),
  );

  passport.use(
    new GitHubStrategy(
      {
        clientID: deps.github.clientId,
        clientSecret: deps.github.clientSecret,
        callbackURL: `${deps.appUrl}/api/auth/github/callback`,
        authorizationURL: deps.github.authorizationURL,
        tokenURL: deps.github.tokenURL,
        userProfileURL: deps.github.userProfileURL,
        userEmailURL: deps.github.userEmailURL,
        scope: ['read:user', 'user:email'],
        allRawEmails: true,
        // The types omit `state`; passport-oauth2 keeps it in the session and checks it on return.
        ...({ state: true } as object),
      },
      (_accessToken: string, _refreshToken: string, profile: GitHubProfile, done: (err: unknown, user?: unknown) => void) => {
        done(null, toGithubProfile(profile));
      },
    ),
  );

  passport.serializeUser((user, done) => done(null, (user as Express.User).id));
  // A suspended or deleted account is signed out on its next request.
  const signedIn = (user: Express.User | null | undefined) => (user && user.status === 'active' ? user : false);
  passport.deserializeUser((req: Request, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
    // Usually read with the session in the same statement (server/lib/session-store.ts).
    const read = userReadWithSession(req, id);
    if (read !== undefined) return done(null, signedIn(read));
    findUserById(deps.db, id).then(
      (user) => done(null, signedIn(user)),
      (error) => done(error),
    );
  });

  return passport;
}

export type AppPassport = ReturnType<typeof createPassport>;
