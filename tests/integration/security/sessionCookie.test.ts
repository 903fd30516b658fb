// The session cookie's flags follow the site's address: Secure with the __Secure- prefix over https.
import { afterEach, describe, expect, it, vi } from 'vitest';

const saved = process.env.APP_URL;
afterEach(() => {
  process.env.APP_URL = saved;
  vi.resetModules();
});

async function cookieSettings(appUrl: string) {
  process.env.APP_URL = appUrl;
  vi.resetModules();
  const { authOptions } = await import('@/lib/auth/options');
  return { useSecureCookies: authOptions.useSecureCookies, session: authOptions.cookies!.sessionToken! };
}

describe('the session cookie', () => {
  it('is httpOnly, SameSite=Lax, Secure and __Secure- prefixed when the site is served over https', async () => {
    const { useSecureCookies, session } = await cookieSettings('https://lacewright.example');
    expect(useSecureCookies).toBe(true);
    expect(session.name).toBe('__Secure-lacewright.session');
    expect(session.options).toMatchObject({ httpOnly: true, sameSite: 'lax', path: '/', secure: true });
  });

  it('drops only Secure on plain http (local use), keeping httpOnly and SameSite', async () => {
    const { useSecureCookies, session } = await cookieSettings('http://127.0.0.1:3000');
    expect(useSecureCookies).toBe(false);
    expect(session.name).toBe('lacewright.session');
    expect(session.options).toMatchObject({ httpOnly: true, sameSite: 'lax', secure: false });
  });
});

describe('where sign-in sends people afterwards', () => {
  it('only to this site', async () => {
    process.env.APP_URL = 'https://lacewright.example';
    vi.resetModules();
    const { authOptions } = await import('@/lib/auth/options');
    const redirect = (url: string) => authOptions.callbacks!.redirect!({ url, baseUrl: 'https://lacewright.example' });
    expect(await redirect('/requests')).toBe('https://lacewright.example/requests');
    expect(await redirect('https://lacewright.example/board')).toBe('https://lacewright.example/board');
    expect(await redirect('https://elsewhere.example/steal')).toBe('https://lacewright.example');
    expect(await redirect('//elsewhere.example/steal')).toBe('https://lacewright.example');
    expect(await redirect(' ')).toBe('https://lacewright.example');
    expect(await redirect('javascript:alert(1)')).toBe('https://lacewright.example');
  });
});
