// Signs in over HTTP the way the sign-in form does (CSRF token, then the password callback) and keeps the
// session cookie for the load driver and the browser.
export interface SignedIn {
  email: string;
  /** "lacewright.session=…", ready for a Cookie header. */
  cookie: string;
  sessionValue: string;
}

const SESSION_COOKIE = 'lacewright.session';

function cookiesFrom(res: Response, jar: Map<string, string>): void {
  for (const raw of res.headers.getSetCookie()) {
    const [pair] = raw.split(';');
    const eq = pair.indexOf('=');
    jar.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
  }
}

const header = (jar: Map<string, string>) => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');

export async function signIn(baseUrl: string, email: string, password: string): Promise<SignedIn> {
  const jar = new Map<string, string>();
  const csrf = await fetch(new URL('/api/auth/csrf', baseUrl));
  cookiesFrom(csrf, jar);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(new URL('/api/auth/callback/password', baseUrl), {
    method: 'POST',
    headers: { cookie: header(jar), 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
    redirect: 'manual',
  });
  cookiesFrom(res, jar);
  const sessionValue = jar.get(SESSION_COOKIE);
  if (!sessionValue) throw new Error(`signing in as ${email} failed (status ${res.status})`);
  return { email, cookie: `${SESSION_COOKIE}=${sessionValue}`, sessionValue };
}

export { SESSION_COOKIE };
