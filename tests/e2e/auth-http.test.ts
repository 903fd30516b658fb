import { describe, expect, it } from 'vitest';
import { Visitor, waitForMail } from '../support/http';

let n = 0;
const email = (kind: string) => `${kind}-${Date.now().toString(36)}-${++n}@example.test`;

describe('sign-up, sign-in and roles over HTTP', () => {
  it('signs up a rider, who can then sign in with the password', async () => {
    const visitor = new Visitor();
    const address = email('rider');
    const created = await visitor.request('/api/accounts', { method: 'POST', json: { role: 'rider', name: 'Http Rider', email: address, password: 'ten chars or more' } });
    expect(created.status).toBe(201);
    const signIn = await visitor.signInWithPassword(address, 'ten chars or more');
    expect(signIn.status).toBe(200);
    const me = await visitor.me();
    expect(me).toMatchObject({ status: 200, body: { email: address, role: 'rider', shopId: null } });
  });

  it('signs up a builder with a shop', async () => {
    const visitor = new Visitor();
    const address = email('builder');
    const created = await visitor.request('/api/accounts', {
      method: 'POST',
      json: { role: 'builder', name: 'Http Builder', email: address, password: 'ten chars or more', shopName: 'Http Truing Bench', zip: '67202' },
    });
    expect(created.status).toBe(201);
    await visitor.signInWithPassword(address, 'ten chars or more');
    const shop = await visitor.request('/api/shop');
    expect(shop.status).toBe(200);
    expect(await shop.json()).toMatchObject({ name: 'Http Truing Bench', region: 'KS', city: 'Wichita' });
  });

  it('answers bad sign-up input with 400 and field messages', async () => {
    const res = await new Visitor().request('/api/accounts', { method: 'POST', json: { role: 'builder', name: '', email: 'not-an-email', password: 'short', zip: 'abc' } });
    expect(res.status).toBe(400);
    const body = (await res.json()) as { fieldErrors: Record<string, string[]> };
    expect(Object.keys(body.fieldErrors)).toEqual(expect.arrayContaining(['name', 'email', 'password', 'shopName', 'zip']));
  });

  it('keeps a wrong password out, without a session cookie', async () => {
    const visitor = new Visitor();
    await visitor.signInWithPassword('rider@demo.lacewright.test', 'not the password');
    expect((await visitor.me()).status).toBe(401);
  });

  it('sets the session cookie httpOnly and SameSite', async () => {
    const visitor = new Visitor();
    const csrfToken = await visitor.csrfToken();
    const res = await visitor.request('/api/auth/callback/password', {
      method: 'POST',
      form: { csrfToken, email: 'rider@demo.lacewright.test', password: 'lacewright-demo', json: 'true' },
    });
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('lacewright.session='));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('signs in with a one-time link e-mailed through SMTP, and the link works only once', async () => {
    const visitor = new Visitor();
    const csrfToken = await visitor.csrfToken();
    const res = await visitor.request('/api/auth/signin/email', { method: 'POST', form: { csrfToken, email: 'builder@demo.lacewright.test', callbackUrl: '/welcome', json: 'true' } });
    expect(res.status).toBe(200);
    const [mail] = await waitForMail('builder@demo.lacewright.test');
    const link = mail.text.match(/https?:\/\/\S+/)![0];
    const url = new URL(link);
    const follow = await visitor.request(url.pathname + url.search);
    expect(follow.status).toBe(302);
    expect(follow.headers.get('location')).toContain('/welcome');
    expect((await visitor.me()).body).toMatchObject({ email: 'builder@demo.lacewright.test', role: 'builder' });

    const again = new Visitor();
    const reuse = await again.request(url.pathname + url.search);
    expect(reuse.headers.get('location')).toContain('error=Verification');
    expect((await again.me()).status).toBe(401);
  });

  it('guards roles: anonymous 401, a rider 403 on a builder route, an admin-only route refuses builders', async () => {
    expect((await new Visitor().request('/api/shop')).status).toBe(401);
    const rider = new Visitor();
    await rider.signInWithPassword('rider@demo.lacewright.test', 'lacewright-demo');
    expect((await rider.request('/api/shop')).status).toBe(403);
    const builder = new Visitor();
    await builder.signInWithPassword('builder@demo.lacewright.test', 'lacewright-demo');
    expect((await builder.request('/api/shop')).status).toBe(200);
    expect((await builder.request('/api/admin/mailbox')).status).toBe(403);
    const admin = new Visitor();
    await admin.signInWithPassword('admin@demo.lacewright.test', 'lacewright-demo');
    expect((await admin.request('/api/admin/mailbox')).status).toBe(200);
  });

  it('sends a visitor to sign in from a role page, and a wrong role to the not-allowed page', async () => {
    // Pages with a loading state stream, so the redirect comes as a header or inside the streamed page;
    // either way the board's own content is never rendered.
    const anon = await new Visitor().request('/board');
    const anonTarget = anon.headers.get('location') ?? (await anon.text());
    expect(anonTarget).toContain('/sign-in?callbackUrl=%2Fboard');
    expect(anonTarget).not.toContain('Open requests</h1>');
    const rider = new Visitor();
    await rider.signInWithPassword('rider@demo.lacewright.test', 'lacewright-demo');
    const wrong = await rider.request('/board');
    const target = wrong.headers.get('location') ?? (await wrong.text());
    expect(target).toContain('/not-allowed');
  });
});
