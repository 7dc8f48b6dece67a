import express from 'express';
import { createHash, randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * A local stand-in for GitHub's OAuth sign-in, for development and tests:
 * the same three endpoints (authorize, access_token, user) plus user/emails,
 * with GitHub's JSON shapes. It signs in made-up identities only.
 */
export interface StandInIdentity {
  login: string;
  name: string;
  email: string;
  /** Whether GitHub would call the primary address verified. */
  verified?: boolean;
}

export const standInIdentities: StandInIdentity[] = [
  { login: 'ash-quillfeather', name: 'Ash Quillfeather', email: 'ash.quillfeather@example.test' },
  { login: 'marlo-tindle', name: 'Marlo Tindle', email: 'marlo.tindle@example.test' },
];

/** A stable numeric id per login, as GitHub's ids are stable. */
const idFor = (login: string) => Number.parseInt(createHash('sha256').update(login).digest('hex').slice(0, 8), 16);

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!);

export function createGithubStandIn(options: { clientId: string; clientSecret: string }) {
  const codes = new Map<string, { identity: StandInIdentity; redirectUri: string; expires: number }>();
  const tokens = new Map<string, StandInIdentity>();
  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false }));
  app.use(express.json());

  app.get('/login/oauth/authorize', (req, res) => {
    const q = req.query as Record<string, string | undefined>;
    if (q.client_id !== options.clientId) return res.status(400).send('Unknown client_id.');
    if (!q.redirect_uri) return res.status(400).send('redirect_uri is required.');
    const hidden = ['client_id', 'redirect_uri', 'state', 'scope']
      .map((k) => `<input type="hidden" name="${k}" value="${escapeHtml(q[k] ?? '')}">`)
      .join('');
    const buttons = standInIdentities
      .map(
        (who) =>
          `<form method="post">${hidden}<input type="hidden" name="login" value="${escapeHtml(who.login)}">` +
          `<button type="submit">Continue as ${escapeHtml(who.name)} (${escapeHtml(who.login)})</button></form>`,
      )
      .join('');
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>GitHub sign-in stand-in</title>
<style>body{font-family:sans-serif;max-width:32rem;margin:3rem auto;line-height:1.5}button{margin:.25rem 0;padding:.5rem 1rem}label{display:block;margin-top:.5rem}</style></head>
<body><h1>GitHub sign-in (local stand-in)</h1>
<p>This page stands in for GitHub on a developer's machine. Pick an identity to continue.</p>
${buttons}
<h2>Or make one up</h2>
<form method="post">${hidden}
<label>Login <input name="login" required pattern="[A-Za-z0-9-]{1,39}"></label>
<label>Name <input name="name" required></label>
<label>E-mail <input name="email" type="email" required></label>
<button type="submit">Continue</button></form></body></html>`);
  });

  app.post('/login/oauth/authorize', (req, res) => {
    const body = req.body as Record<string, string | undefined>;
    if (body.client_id !== options.clientId || !body.redirect_uri || !body.login) {
      return res.status(400).send('client_id, redirect_uri and login are required.');
    }
    const identity =
      standInIdentities.find((who) => who.login === body.login) ??
      (body.name && body.email ? { login: body.login, name: body.name, email: body.email } : undefined);
    if (!identity) return res.status(400).send('Unknown identity; give a name and an e-mail address.');
    const code = randomBytes(16).toString('hex');
    codes.set(code, { identity, redirectUri: body.redirect_uri, expires: Date.now() + 10 * 60_000 });
    const target = new URL(body.redirect_uri);
    target.searchParams.set('code', code);
    if (body.state) target.searchParams.set('state', body.state);
    res.redirect(302, target.toString());
  });

  app.post('/login/oauth/access_token', (req, res) => {
    const body = req.body as Record<string, string | undefined>;
    const entry = body.code ? codes.get(body.code) : undefined;
    if (body.client_id !== options.clientId || body.client_secret !== options.clientSecret) {
      return res.json({ error: 'incorrect_client_credentials', error_description: 'The client_id and/or client_secret passed are incorrect.' });
    }
    if (!entry || entry.expires < Date.now() || (body.redirect_uri && body.redirect_uri !== entry.redirectUri)) {
      return res.json({ error: 'bad_verification_code', error_description: 'The code passed is incorrect or expired.' });
    }
    codes.delete(body.code!);
    const accessToken = `gho_${randomBytes(18).toString('hex')}`;
    tokens.set(accessToken, entry.identity);
    res.json({ access_token: accessToken, token_type: 'bearer', scope: 'read:user,user:email' });
  });

  const whoIs = (authorization: string | undefined) => {
    const match = /^(?:token|bearer)\s+(\S+)$/i.exec(authorization ?? '');
    return match ? tokens.get(match[1]) : undefined;
  };

  app.get('/user', (req, res) => {
    const who = whoIs(req.get('authorization'));
    if (!who) return res.status(401).json({ message: 'Requires authentication' });
    res.json({
      login: who.login,
      id: idFor(who.login),
      node_id: `U_${idFor(who.login).toString(36)}`,
      avatar_url: null,
      html_url: `http://127.0.0.1/${who.login}`,
      type: 'User',
      name: who.name,
      email: who.email,
    });
  });

  app.get('/user/emails', (req, res) => {
    const who = whoIs(req.get('authorization'));
    if (!who) return res.status(401).json({ message: 'Requires authentication' });
    res.json([{ email: who.email, primary: true, verified: who.verified ?? true, visibility: 'public' }]);
  });

  return app;
}

export async function startGithubStandIn(options: { port: number; clientId: string; clientSecret: string }): Promise<{
  server: Server;
  url: string;
  close: () => Promise<void>;
}> {
  const server = createServer(createGithubStandIn(options));
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, '127.0.0.1', () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  return {
    server,
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
