import supertest from 'supertest';
import { SESSION_COOKIE, type App } from '../../server/app';

/** The session cookie (name=value) among an answer's Set-Cookie headers, if it sets one. */
function sessionCookieIn(header: string[] | string | undefined): string | undefined {
  const all = Array.isArray(header) ? header : header ? [header] : [];
  return all.find((c) => c.startsWith(`${SESSION_COOKIE}=`))?.split(';')[0];
}

/**
 * A supertest agent that keeps cookies and sends the CSRF token it was given,
 * against an in-process app or a listening one's address (e.g. `server.url`).
 */
export async function agentFor(target: App | string) {
  const agent = supertest.agent(target);
  const res = await agent.get('/api/auth/csrf');
  if (res.status !== 200) throw new Error(`no CSRF token: ${res.status}`);
  let token: string = res.body.csrfToken;
  let cookie = sessionCookieIn(res.headers['set-cookie']);
  return {
    agent,
    get token() {
      return token;
    },
    set token(value: string) {
      token = value;
    },
    /** The session cookie (name=value) as last set, for callers that send it by hand (sockets, raw requests). */
    get cookie() {
      return cookie;
    },
    /** Posts with the current token and keeps the new token and cookie when the answer rotates them (sign-in, sign-up). */
    async post(path: string, body: object = {}) {
      const res = await agent.post(path).set('X-CSRF-Token', token).send(body);
      if (typeof res.body?.csrfToken === 'string') token = res.body.csrfToken;
      cookie = sessionCookieIn(res.headers['set-cookie']) ?? cookie;
      return res;
    },
    put(path: string, body: object = {}) {
      return agent.put(path).set('X-CSRF-Token', token).send(body);
    },
    /** Sends files as multipart field `field` (e.g. photos), with the current token. */
    upload(path: string, field: string, files: Array<{ buffer: Buffer; name: string; mimeType?: string }>) {
      let req = agent.post(path).set('X-CSRF-Token', token);
      for (const file of files) req = req.attach(field, file.buffer, { filename: file.name, contentType: file.mimeType });
      return req;
    },
    get(path: string) {
      return agent.get(path);
    },
  };
}

export type ApiClient = Awaited<ReturnType<typeof agentFor>>;

/**
 * The one way tests build a signed-in API session: an agent signed in as this
 * person (made by the factories, or a demo account, so the password is known),
 * holding the CSRF token and session cookie the sign-in gave.
 */
export async function signedIn(target: App | string, user: { email: string; password: string }): Promise<ApiClient> {
  const client = await agentFor(target);
  const res = await client.post('/api/auth/login', { email: user.email, password: user.password });
  if (res.status !== 200) throw new Error(`sign-in failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  return client;
}
