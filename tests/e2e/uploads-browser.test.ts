// Photo uploads against the running app and its S3 stand-in: the API over HTTP, then a real browser
// sending a file straight to the store (CORS preflight, upload progress) and viewing it through the app.
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';
import { Visitor } from '../support/http';

const appUrl = inject('appUrl');
const PASSWORD = 'a long upload test password';

async function signUp(role: 'rider' | 'builder'): Promise<{ visitor: Visitor; id: string; shopId: string | null }> {
  const visitor = new Visitor();
  const email = `uploads-${role}-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@example.test`;
  const body =
    role === 'builder'
      ? { role, name: 'Upload Builder', email, password: PASSWORD, shopName: `Upload Truing Stand ${Date.now()}`, zip: '53202' }
      : { role, name: 'Upload Rider', email, password: PASSWORD };
  const res = await visitor.request('/api/accounts', { method: 'POST', json: body });
  expect(res.status).toBe(201);
  const account = (await res.json()) as { id: string; shopId: string | null };
  expect((await visitor.signInWithPassword(email, PASSWORD)).status).toBe(200);
  return { visitor, ...account };
}

async function photo(width = 900, height = 600): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: '#17716f' } })
    .jpeg()
    .withExif({ IFD0: { Make: 'Quillfeather' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 2/1 0/1' } })
    .toBuffer();
}

interface Created {
  uploadId: string;
  uploadUrl: string;
  headers: Record<string, string>;
}

async function start(visitor: Visitor, subjectId: string, file: Buffer, fileName = 'wheel.jpg') {
  return visitor.request('/api/uploads', { method: 'POST', json: { purpose: 'portfolio', subjectId, fileName, contentType: 'image/jpeg', bytes: file.length } });
}

describe('photo uploads over HTTP', () => {
  let builder: Awaited<ReturnType<typeof signUp>>;
  beforeAll(async () => {
    builder = await signUp('builder');
  });

  it('create, PUT to the presigned URL, finalize, then anyone views the cleaned photo and thumbnail through the app', async () => {
    const file = await photo();
    const res = await start(builder.visitor, builder.shopId!, file);
    expect(res.status).toBe(201);
    const created = (await res.json()) as Created;
    expect(new URL(created.uploadUrl).pathname).toMatch(new RegExp(`/incoming/${builder.id}/`));
    const put = await fetch(created.uploadUrl, { method: 'PUT', headers: created.headers, body: new Uint8Array(file) });
    expect(put.status).toBe(200);

    const done = await builder.visitor.request(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' });
    expect(done.status).toBe(200);
    const view = (await done.json()) as { id: string; width: number; height: number; thumbUrl: string; imageUrl: string };
    expect(view).toMatchObject({ id: created.uploadId, width: 900, height: 600 });

    const anonymous = new Visitor();
    const image = await anonymous.request(view.imageUrl);
    expect(image.status).toBe(200);
    expect(image.headers.get('content-type')).toBe('image/jpeg');
    expect(image.headers.get('x-content-type-options')).toBe('nosniff');
    const meta = await sharp(Buffer.from(await image.arrayBuffer())).metadata();
    expect([meta.width, meta.height, meta.exif]).toEqual([900, 600, undefined]);
    const thumb = await anonymous.request(view.thumbUrl);
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).width).toBe(320);

    const list = await anonymous.request(`/api/uploads?purpose=portfolio&subjectId=${builder.shopId}`);
    expect(((await list.json()) as { uploads: { id: string }[] }).uploads.map((u) => u.id)).toContain(view.id);
  });

  it('refuses a text file named photo.jpg at finalize with a plain 422', async () => {
    const text = Buffer.from('not a photo at all\n'.repeat(40));
    const created = (await (await start(builder.visitor, builder.shopId!, text, 'photo.jpg')).json()) as Created;
    expect((await fetch(created.uploadUrl, { method: 'PUT', headers: created.headers, body: new Uint8Array(text) })).status).toBe(200);
    const res = await builder.visitor.request(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' });
    expect(res.status).toBe(422);
    expect(await res.json()).toEqual({ error: 'This file is not a JPEG, PNG or WebP image, whatever its name says.' });
  });

  it('refuses an oversized declaration (413), a signed-out start (401) and another person’s shop (403)', async () => {
    const big = await builder.visitor.request('/api/uploads', {
      method: 'POST',
      json: { purpose: 'portfolio', subjectId: builder.shopId, fileName: 'big.jpg', contentType: 'image/jpeg', bytes: 50 * 1024 * 1024 },
    });
    expect(big.status).toBe(413);
    expect(((await big.json()) as { error: string }).error).toBe('big.jpg is too large: photos can be at most 8 MB.');
    expect((await start(new Visitor(), builder.shopId!, Buffer.alloc(10))).status).toBe(401);
    const rider = await signUp('rider');
    expect((await start(rider.visitor, builder.shopId!, Buffer.alloc(10))).status).toBe(403);
  });

  it('only the uploader removes a photo; afterwards it is gone', async () => {
    const file = await photo(400, 300);
    const created = (await (await start(builder.visitor, builder.shopId!, file)).json()) as Created;
    await fetch(created.uploadUrl, { method: 'PUT', headers: created.headers, body: new Uint8Array(file) });
    await builder.visitor.request(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' });
    const other = await signUp('builder');
    expect((await other.visitor.request(`/api/uploads/${created.uploadId}`, { method: 'DELETE' })).status).toBe(403);
    expect((await builder.visitor.request(`/api/uploads/${created.uploadId}`, { method: 'DELETE' })).status).toBe(200);
    expect((await new Visitor().request(`/api/uploads/${created.uploadId}/image`)).status).toBe(404);
  });
});

describe('photo uploads from a browser', () => {
  let browser: Awaited<ReturnType<typeof openBrowser>>;
  let page: Page;
  beforeAll(async () => {
    browser = await openBrowser();
    page = browser.page;
  });
  afterAll(() => browser?.close());

  it('PUTs straight to the store across origins with progress events, and shows the thumbnail from the app', async () => {
    const builder = await signUp('builder');
    await browser.context.addCookies(
      builder.visitor
        .cookieHeader()
        .split('; ')
        .filter(Boolean)
        .map((pair) => ({ name: pair.slice(0, pair.indexOf('=')), value: pair.slice(pair.indexOf('=') + 1), url: appUrl })),
    );
    const requests: string[] = [];
    page.on('request', (r) => requests.push(`${r.method()} ${r.url()}`));
    await page.goto(appUrl);

    // A noisy picture so the file is big enough for several progress events.
    const noisy = await sharp(Buffer.from(Array.from({ length: 600 * 400 * 3 }, (_, i) => (i * 7919) % 251)), { raw: { width: 600, height: 400, channels: 3 } })
      .jpeg({ quality: 95 })
      .toBuffer();
    const result = await page.evaluate(
      async ({ bytes, subjectId }) => {
        const file = new File([new Uint8Array(bytes)], 'bench.jpg', { type: 'image/jpeg' });
        const created = await fetch('/api/uploads', {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ purpose: 'portfolio', subjectId, fileName: file.name, contentType: file.type, bytes: file.size }),
        }).then((r) => r.json());
        const progress: number[] = [];
        const status = await new Promise<number>((resolve) => {
          const xhr = new XMLHttpRequest();
          xhr.open('PUT', created.uploadUrl);
          for (const [k, v] of Object.entries(created.headers as Record<string, string>)) xhr.setRequestHeader(k, v);
          xhr.upload.onprogress = (e) => progress.push(e.loaded / e.total);
          xhr.onload = () => resolve(xhr.status);
          xhr.onerror = () => resolve(-1);
          xhr.send(file);
        });
        const view = await fetch(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' }).then((r) => r.json());
        const img = document.createElement('img');
        img.src = view.thumbUrl;
        document.body.prepend(img);
        await img.decode();
        return { status, progress, uploadUrl: created.uploadUrl as string, thumbWidth: img.naturalWidth };
      },
      { bytes: [...noisy], subjectId: builder.shopId! },
    );
    expect(result.status).toBe(200);
    expect(result.progress.length).toBeGreaterThan(0);
    expect(result.progress.at(-1)).toBe(1);
    expect(result.thumbWidth).toBe(320);
    await screenshot(page, 'uploads-browser-thumbnail');

    // The browser talked to the store only for the PUT (and its preflight); the photo came from the app.
    const storeOrigin = new URL(result.uploadUrl).origin;
    const toStore = requests.filter((r) => r.split(' ')[1].startsWith(storeOrigin));
    expect(toStore.map((r) => r.split(' ')[0]).filter((m) => m !== 'OPTIONS')).toEqual(['PUT']);
    expect(requests.some((r) => r.startsWith(`GET ${appUrl}/api/uploads/`) && r.endsWith('/thumb'))).toBe(true);
  });
});
