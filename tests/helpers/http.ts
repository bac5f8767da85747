/** A tiny HTTP client with a cookie jar, for talking to the running app as one person. */
export const APP_URL = process.env.APP_URL ?? 'http://localhost:3100';

export class Client {
  private cookies = new Map<string, string>();

  /** `base` is another app server's URL, for tests that run one of their own. */
  constructor(readonly base = APP_URL) {}

  private remember(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair!.indexOf('=');
      const name = pair!.slice(0, eq).trim();
      const value = pair!.slice(eq + 1).trim();
      if (value === '' || /max-age=0/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  cookie(name: string) {
    return this.cookies.get(name);
  }

  /** The Cookie header this client sends, for requests made without fetch (tests/helpers/raw.ts). */
  get cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async fetch(path: string, init: RequestInit = {}) {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '));
    const res = await fetch(new URL(path, this.base), { ...init, headers, redirect: 'manual' });
    this.remember(res);
    return res;
  }

  json(path: string, method: string, body?: unknown) {
    return this.fetch(path, {
      method,
      headers: { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  }

  async csrf() {
    const res = await this.fetch('/api/auth/csrf');
    return ((await res.json()) as { csrfToken: string }).csrfToken;
  }

  async postForm(path: string, fields: Record<string, string>, headers: Record<string, string> = {}) {
    return this.fetch(path, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers },
      body: new URLSearchParams(fields),
    });
  }

  /** Signs in through next-auth's credentials endpoint, as the sign-in page does. */
  async signIn(email: string, password: string, headers: Record<string, string> = {}) {
    const csrfToken = await this.csrf();
    return this.postForm('/api/auth/callback/credentials', { email, password, csrfToken, json: 'true', callbackUrl: '/' }, headers);
  }

  get signedIn() {
    return [...this.cookies.keys()].some((k) => k.endsWith('next-auth.session-token'));
  }
}
