import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createUser } from '../factories';
import { approveOnGithub, githubIdentity, newGithubLogin } from '../setup/github';
import { agentFor, setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

type Client = Awaited<ReturnType<typeof agentFor>>;

/**
 * Walks the whole OAuth round trip as a browser would: our app sends the
 * browser to the provider, the person approves, the provider sends the
 * browser back with a code, and our app trades the code for a profile.
 */
async function roundTrip(client: Client, identity: { login: string; name?: string; email?: string }, returnTo?: string) {
  const start = await client.get(`/api/auth/github${returnTo ? `?returnTo=${encodeURIComponent(returnTo)}` : ''}`);
  expect(start.status).toBe(302);
  const authorize = new URL(start.headers.location);
  expect(authorize.pathname).toBe('/login/oauth/authorize');
  const state = authorize.searchParams.get('state');
  expect(state).toBeTruthy();

  const page = await fetch(authorize);
  expect(page.status).toBe(200);

  const approve = await approveOnGithub(authorize, identity);
  expect(approve.status).toBe(302);
  const back = new URL(approve.headers.get('location')!);
  expect(back.pathname).toBe('/api/auth/github/callback');
  expect(back.searchParams.get('state')).toBe(state);

  return client.get(back.pathname + back.search);
}

const newIdentity = () => githubIdentity(newGithubLogin());

describe('GitHub sign-in through the local stand-in', () => {
  it('when a new GitHub user signs in, then they choose a role, get an account with a verified e-mail, and come back signed in', async () => {
    const identity = newIdentity();
    const client = await agentFor(ctx.app);
    const callback = await roundTrip(client, identity);
    expect(callback.status).toBe(302);
    expect(callback.headers.location).toBe('/welcome/github');
    await client.get('/api/auth/me').expect(401);

    const pending = await client.get('/api/auth/github/pending').expect(200);
    expect(pending.body.pending).toEqual({ login: identity.login, email: identity.email, displayName: identity.name });

    const badRole = await client.post('/api/auth/github/complete', { role: 'admin' });
    expect(badRole.status).toBe(400);

    const done = await client.post('/api/auth/github/complete', { role: 'shop', acceptTerms: true });
    expect(done.status).toBe(201);
    expect(done.body.user).toMatchObject({ email: identity.email, role: 'shop', emailVerified: true, githubLinked: true, hasPassword: false });
    const me = await client.get('/api/auth/me').expect(200);
    expect(me.body.user.role).toBe('shop');

    // Signing in again with the same GitHub account goes straight to the return path.
    await client.post('/api/auth/logout');
    const again = await agentFor(ctx.app);
    const second = await roundTrip(again, { login: identity.login, name: identity.name, email: identity.email }, '/dashboard?tab=jobs');
    expect(second.status).toBe(302);
    expect(second.headers.location).toBe('/dashboard?tab=jobs');
    expect((await again.get('/api/auth/me').expect(200)).body.user.id).toBe(done.body.user.id);
  });

  it('when the return path points off-site, then the sign-in returns to the dashboard instead', async () => {
    const identity = newIdentity();
    const client = await agentFor(ctx.app);
    await roundTrip(client, identity);
    await client.post('/api/auth/github/complete', { role: 'builder', acceptTerms: true });
    await client.post('/api/auth/logout');
    const again = await agentFor(ctx.app);
    const res = await roundTrip(again, identity, '//evil.example/steal');
    expect(res.headers.location).toBe('/dashboard');
  });

  it('when the GitHub e-mail belongs to a password account, then no account is made and the person is told to use their password', async () => {
    const existing = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await roundTrip(client, { login: newGithubLogin(), name: 'Double', email: existing.email });
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe('/signin?error=email_taken');
    await client.get('/api/auth/github/pending').expect(404);
  });

  it('when the state does not match, then the sign-in fails safely', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.get('/api/auth/github/callback?code=whatever&state=forged');
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe('/signin?error=github_failed');
    await client.get('/api/auth/me').expect(401);
  });

  it('when nobody started a GitHub sign-in, then completing one is a 404', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/github/complete', { role: 'builder', acceptTerms: true });
    expect(res.status).toBe(404);
  });
});
