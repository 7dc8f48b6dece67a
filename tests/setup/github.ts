import { randomBytes } from 'node:crypto';

/**
 * The GitHub stand-in's approval page, filled in as a person would. Our app's
 * sign-in start redirects the browser to the stand-in's authorize page; the
 * person approves there as some GitHub identity, and the stand-in answers with
 * a redirect back to our callback carrying the code and the state.
 */

/** Who signs in on the approval page (name and e-mail are left off the form when missing). */
export interface GithubIdentity {
  login: string;
  name?: string;
  email?: string;
}

/** An identity whose name and e-mail are made from its login. */
export const githubIdentity = (login: string) => ({ login, name: `Person ${login}`, email: `${login}@example.test` });

/** A login nobody has signed in with yet. */
export const newGithubLogin = () => `gh-${randomBytes(4).toString('hex')}`;

/** Posts the approval form for `authorize` (the URL the sign-in start sent the browser to); resolves to the stand-in's raw answer. */
export function approveOnGithub(authorize: URL, identity: GithubIdentity) {
  return fetch(authorize.origin + authorize.pathname, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({
      client_id: authorize.searchParams.get('client_id')!,
      redirect_uri: authorize.searchParams.get('redirect_uri')!,
      state: authorize.searchParams.get('state')!,
      login: identity.login,
      ...(identity.name ? { name: identity.name } : {}),
      ...(identity.email ? { email: identity.email } : {}),
    }),
  });
}
