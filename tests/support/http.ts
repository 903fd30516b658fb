// A tiny HTTP client with a cookie jar, for talking to the running app as one visitor.
import { inject } from 'vitest';

export class Visitor {
  private cookies = new Map<string, string>();
  constructor(readonly baseUrl: string = inject('appUrl')) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  setCookiesFrom(res: Response): void {
    for (const raw of res.headers.getSetCookie()) {
      const [pair] = raw.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (/max-age=0|expires=Thu, 01 Jan 1970/i.test(raw) || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  rawCookie(name: string): string | undefined {
    return this.cookies.get(name);
  }

  async request(path: string, init: RequestInit & { json?: unknown; form?: Record<string, string> } = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    headers.set('cookie', this.cookieHeader());
    let body = init.body;
    if (init.json !== undefined) {
      headers.set('content-type', 'application/json');
      body = JSON.stringify(init.json);
    } else if (init.form) {
      headers.set('content-type', 'application/x-www-form-urlencoded');
      body = new URLSearchParams(init.form).toString();
    }
    const res = await fetch(new URL(path, this.baseUrl), { ...init, headers, body, redirect: 'manual' });
    this.setCookiesFrom(res);
    return res;
  }

  async csrfToken(): Promise<string> {
    const res = await this.request('/api/auth/csrf');
    return ((await res.json()) as { csrfToken: string }).csrfToken;
  }

  async signInWithPassword(email: string, password: string): Promise<Response> {
    const csrfToken = await this.csrfToken();
    return this.request('/api/auth/callback/password', { method: 'POST', form: { csrfToken, email, password, json: 'true' } });
  }

  async me(): Promise<{ status: number; body: { id?: string; role?: string; shopId?: string | null; email?: string } }> {
    const res = await this.request('/api/me');
    return { status: res.status, body: await res.json() };
  }
}

export async function caughtMail(to: string, mailApiUrl: string = inject('mailApiUrl')) {
  const res = await fetch(`${mailApiUrl}/messages?to=${encodeURIComponent(to)}`);
  return (await res.json()) as { subject: string; text: string; to: string[] }[];
}

export async function waitForMail(to: string, timeoutMs = 10_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const messages = await caughtMail(to);
    if (messages.length) return messages;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail for ${to} within ${timeoutMs} ms`);
}
