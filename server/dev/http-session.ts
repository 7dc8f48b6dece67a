/**
 * A signed-in HTTP session against a running app: a cookie jar and the CSRF
 * token, kept as a browser keeps them. Used by the demo scenario and by tests
 * that drive an app in another process.
 */
export class HttpSession {
  private cookies = new Map<string, string>();
  private token = '';

  private constructor(private readonly base: string) {}

  static async signIn(base: string, email: string, password: string) {
    const session = new HttpSession(base);
    session.token = (await session.call<{ csrfToken: string }>('GET', '/api/auth/csrf')).csrfToken;
    const answer = await session.call<{ csrfToken: string }>('POST', '/api/auth/login', { email, password });
    session.token = answer.csrfToken;
    return session;
  }

  /** The session's cookies as a Cookie header (for a browser or tool told to send them). */
  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async call<T>(method: 'GET' | 'POST' | 'PUT', path: string, body?: unknown): Promise<T> {
    const headers: Record<string, string> = { cookie: this.cookieHeader() };
    if (method !== 'GET') headers['x-csrf-token'] = this.token;
    let payload: BodyInit | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(`${this.base}${path}`, { method, headers, body: payload, redirect: 'manual' });
    for (const cookie of res.headers.getSetCookie()) {
      const [pair] = cookie.split(';');
      const at = pair.indexOf('=');
      this.cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
    const text = await res.text();
    if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${text.slice(0, 300)}`);
    return (text ? JSON.parse(text) : {}) as T;
  }
}
