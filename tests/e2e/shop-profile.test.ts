// A shop's public page in a browser: rating, reviews, track record with the typical lead time, portfolio
// photos; a rider invites the shop to bid (the shop is e-mailed once); the rider reviews a completed job on
// the job page. Also the profile and review routes over HTTP.
import knex, { type Knex } from 'knex';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { createReview } from '@/lib/reviews/writeReview';
import { knexConfig } from '../../knexfile';
import { daysAfter, makeJob, makeRider, shopReviewInput } from '../integration/reviews/support';
import { openBrowser, screenshot } from '../support/browser';
import { Visitor, waitForMail } from '../support/http';

const appUrl = inject('appUrl');
const PASSWORD = 'a long shop profile password';
const stamp = `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;

let db: Knex;
let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;
const builder = { email: `profile-builder-${stamp}@example.test`, visitor: new Visitor(), shopId: '', slug: '' };
const rider = { email: `profile-rider-${stamp}@example.test`, visitor: new Visitor(), id: '', requestId: '', jobId: '' };

async function signUp(visitor: Visitor, body: Record<string, string>): Promise<{ id: string; shopId: string | null }> {
  const res = await visitor.request('/api/accounts', { method: 'POST', json: { ...body, password: PASSWORD } });
  expect(res.status).toBe(201);
  const account = (await res.json()) as { id: string; shopId: string | null };
  expect((await visitor.signInWithPassword(body.email, PASSWORD)).status).toBe(200);
  return account;
}

/** A portfolio photo sent the way the browser sends it: presigned PUT, then finalize. */
async function addPortfolioPhoto(colour: string) {
  const file = await sharp({ create: { width: 800, height: 600, channels: 3, background: colour } })
    .jpeg()
    .toBuffer();
  const res = await builder.visitor.request('/api/uploads', {
    method: 'POST',
    json: { purpose: 'portfolio', subjectId: builder.shopId, fileName: 'wheel.jpg', contentType: 'image/jpeg', bytes: file.length },
  });
  expect(res.status).toBe(201);
  const created = (await res.json()) as { uploadId: string; uploadUrl: string; headers: Record<string, string> };
  expect((await fetch(created.uploadUrl, { method: 'PUT', headers: created.headers, body: new Uint8Array(file) })).status).toBe(200);
  expect((await builder.visitor.request(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' })).status).toBe(200);
}

beforeAll(async () => {
  db = knex(knexConfig(inject('appDatabaseUrl')));
  const shopAccount = await signUp(builder.visitor, { role: 'builder', name: 'Profile Builder', email: builder.email, shopName: `Quarry Lane Spokeworks ${stamp}`, zip: '80202' });
  builder.shopId = shopAccount.shopId!;
  // Wide rims only, so the matcher does not invite this shop to the rider's 3-inch request below.
  await db('shops')
    .where({ id: builder.shopId })
    .update({
      bio: 'Two benches and a dishing gauge. Wide rims, heavy spokes.',
      capabilities: JSON.stringify({ rimWidthsIn: [4, 5], diametersIn: [26], gauges: [12, 10], spokeCounts: [72], hubDrilling: true, finishes: ['polished'] }),
    });
  builder.slug = (await db('shops').where({ id: builder.shopId }).first('slug')).slug;

  // Three builds whose reviews are open to view (5, 4 and 4 stars), funded to shipped in 18, 20 and 25 days against 21 promised.
  const actualDays = [18, 20, 25];
  const stars = [5, 4, 4];
  for (let i = 0; i < 3; i++) {
    const reviewer = await makeRider(db, `Reviewer${i} Example`);
    const completedAt = daysAfter(new Date(), -30 - i);
    const shippedAt = daysAfter(completedAt, -2);
    const { jobId } = await makeJob(db, reviewer, builder.shopId, { completedAt, shippedAt, fundedAt: daysAfter(shippedAt, -actualDays[i]), leadTimeDays: 21 });
    await createReview(db, reviewer, shopReviewInput(jobId, stars[i], `Build ${i}: straight and true.`), daysAfter(completedAt, 1));
  }
  await addPortfolioPhoto('#17716f');
  await addPortfolioPhoto('#b98a2e');

  // The rider: an open request to invite the shop to, and a job of theirs that has just completed (19 days, on time).
  rider.id = (await signUp(rider.visitor, { role: 'rider', name: 'Profile Rider', email: rider.email })).id;
  const res = await rider.visitor.request('/api/requests', {
    method: 'POST',
    json: {
      title: `Profile test rear ${stamp}`,
      wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' }],
      frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
      zip: '90802',
      delivery: 'ship',
      neededBy: daysAfter(new Date(), 60).toISOString().slice(0, 10),
      budgetCents: 60_000,
      publish: true,
    },
  });
  expect(res.status).toBe(201);
  rider.requestId = ((await res.json()) as { id: string }).id;
  const now = new Date();
  rider.jobId = (await makeJob(db, { id: rider.id } as never, builder.shopId, { completedAt: now, shippedAt: daysAfter(now, -1), fundedAt: daysAfter(now, -20), leadTimeDays: 21 })).jobId;

  browser = await openBrowser();
  page = browser.page;
});

afterAll(async () => {
  await browser?.close();
  await db?.destroy();
});

describe('the shop profile over HTTP', () => {
  it('answers the public profile as JSON, and 404 for an unknown shop', async () => {
    const res = await new Visitor().request(`/api/shops/${builder.slug}`);
    expect(res.status).toBe(200);
    const profile = await res.json();
    expect(profile).toMatchObject({ slug: builder.slug, completedBuilds: 4, viewerIsMember: false, rating: { count: 3, positive: 3 } });
    expect(profile.rating.average).toBeCloseTo(13 / 3, 10);
    expect(profile.leadTime).toMatchObject({ builds: 4, medianActualDays: 19.5, medianPromisedDays: 21, onTime: 3 });
    expect(profile.photos).toHaveLength(2);
    expect(profile.reviews).toHaveLength(3);
    expect((await new Visitor().request('/api/shops/no-such-shop-here')).status).toBe(404);
    expect((await builder.visitor.request(`/api/shops/${builder.slug}`).then((r) => r.json())).viewerIsMember).toBe(true);
  });
});

describe('the shop page in a browser', () => {
  it('shows a visitor the rating, reviews, lead time and photos', async () => {
    await page.goto(`${appUrl}/shops/${builder.slug}`);
    await expect(page.getByRole('heading', { level: 1 }).innerText()).resolves.toContain('Quarry Lane Spokeworks');
    const rating = page.getByTestId('rating-summary');
    await expect(rating.innerText()).resolves.toMatch(/4\.3[\s\S]*from 3 reviews/);
    await expect(page.getByRole('img', { name: '4.3 of 5 stars' }).count()).resolves.toBeGreaterThan(0);
    await expect(page.getByTestId('review-list').locator('li').count()).resolves.toBe(3);
    await expect(page.getByText('Build 2: straight and true.').isVisible()).resolves.toBe(true);
    const record = await page.getByTestId('track-record').innerText();
    expect(record).toMatch(/Completed builds on Lacewright\s*4/);
    expect(record).toContain('20 days from payment to shipping (median)');
    expect(record).toContain('Promised 21 days (median); 3 of 4 shipped on time (75 %)');
    const photos = page.getByRole('img', { name: /Portfolio photo \d of 2/ });
    await expect(photos.count()).resolves.toBe(2);
    await page.waitForFunction(() => [...document.querySelectorAll('img[alt^="Portfolio photo"]')].every((img) => (img as HTMLImageElement).naturalWidth > 0));
    await expect(page.getByText('Sign in as a rider').isVisible()).resolves.toBe(true);
    await screenshot(page, 'shop-profile-visitor');
  });

  it('lets a signed-in rider invite the shop to bid once; the shop gets one e-mail', async () => {
    await page.context().clearCookies();
    await page.goto(`${appUrl}/sign-in?callbackUrl=${encodeURIComponent(`/shops/${builder.slug}`)}`);
    await page.getByLabel('E-mail', { exact: true }).fill(rider.email);
    await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await page.goto(`${appUrl}/shops/${builder.slug}`);
    await page.getByLabel('Your open request').selectOption(rider.requestId);
    await page.getByRole('button', { name: 'Invite to bid' }).click();
    await expect(page.getByText('has been e-mailed an invitation to bid').waitFor()).resolves.toBeUndefined();
    await screenshot(page, 'shop-profile-invited');
    await page.getByRole('button', { name: 'Invite to bid' }).click();
    await expect(page.getByText('was already invited to this request; no second e-mail was sent').waitFor()).resolves.toBeUndefined();

    const [mail] = await waitForMail(builder.email, 20_000);
    expect(mail.subject).toContain('Invitation to bid');
    expect(mail.text).toContain(`/board/${rider.requestId}`);
    expect(await db('outbox').where({ to_email: builder.email, kind: 'request.invitation' })).toHaveLength(1);
  });

  it('lets the rider review the completed job from the job page; the shop cannot read it yet', async () => {
    await page.goto(`${appUrl}/jobs/${rider.jobId}`);
    const form = page.getByRole('form', { name: 'Review the shop' });
    await form.getByLabel('Overall: 4 stars').check({ force: true });
    await form.getByLabel('Build quality: 5 stars').check({ force: true });
    await form.getByLabel('Communication: 4 stars').check({ force: true });
    await form.getByLabel('On time: 4 stars').check({ force: true });
    await form.getByLabel('In your words (optional)').fill('Laced in under three weeks and packed well.');
    await form.getByRole('button', { name: 'Post review' }).click();
    await expect(page.getByText('Your review of the shop').waitFor()).resolves.toBeUndefined();
    await expect(page.getByText('Laced in under three weeks and packed well.').isVisible()).resolves.toBe(true);
    await expect(page.getByRole('button', { name: 'Change my review' }).isVisible()).resolves.toBe(true);
    await screenshot(page, 'job-review-written');

    const shopView = await (await builder.visitor.request(`/api/reviews?jobId=${rider.jobId}`)).json();
    expect(shopView).toMatchObject({ viewerSide: 'shop', canWrite: true, byRider: null, written: { rider: true, shop: false } });
    // Still hidden, so the public rating has not moved.
    expect((await (await new Visitor().request(`/api/shops/${builder.slug}`)).json()).rating.count).toBe(3);
  });

  it('opens both reviews once the shop writes its own, after which the rider can no longer change theirs', async () => {
    const res = await builder.visitor.request('/api/reviews', {
      method: 'POST',
      json: { jobId: rider.jobId, side: 'shop', overall: 5, aspects: { clearSpec: 5, communication: 5, payment: 5 }, text: 'Measured everything twice.' },
    });
    expect(res.status).toBe(201);
    const riderView = await (await rider.visitor.request(`/api/reviews?jobId=${rider.jobId}`)).json();
    expect(riderView.byShop).toMatchObject({ overall: 5, text: 'Measured everything twice.' });
    const patch = await rider.visitor.request(`/api/reviews/${riderView.byRider.id}`, { method: 'PATCH', json: { overall: 1 } });
    expect(patch.status).toBe(409);
    expect((await (await new Visitor().request(`/api/shops/${builder.slug}`)).json()).rating.count).toBe(4);

    await page.goto(`${appUrl}/jobs/${rider.jobId}`);
    await expect(page.getByText('Measured everything twice.').waitFor()).resolves.toBeUndefined();
    await screenshot(page, 'job-reviews-open');
  });
});
