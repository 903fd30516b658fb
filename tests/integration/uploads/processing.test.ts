import { GetObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createUpload } from '@/lib/storage/createUpload';
import { discardStaleUploads } from '@/lib/storage/discardStaleUploads';
import { finalizeUpload } from '@/lib/storage/finalizeUpload';
import { readUploadImage } from '@/lib/storage/readUploadImage';
import { testDb } from '../../support/db';
import { GPS_EXIF, hasGpsPointer, makeBuilder, photoJpeg, putTo, startS3, type S3Harness } from './support';

const db = testDb();
let s3: S3Harness;
beforeAll(async () => {
  s3 = await startS3();
});
afterAll(async () => {
  await s3.stop();
  await db.destroy();
});

async function objectBytes(key: string): Promise<Buffer> {
  const res = await s3.storage.client.send(new GetObjectCommand({ Bucket: s3.fake.bucket, Key: key }));
  return Buffer.from(await res.Body!.transformToByteArray());
}

async function streamBytes(stream: ReadableStream): Promise<Buffer> {
  return Buffer.from(await new Response(stream).arrayBuffer());
}

/** A builder uploads a portfolio photo through the presigned URL and finalizes it. */
async function uploadPortfolio(photo: Buffer, contentType: 'image/jpeg' | 'image/png' | 'image/webp' = 'image/jpeg') {
  const builder = await makeBuilder(db);
  const created = await createUpload(db, builder, { purpose: 'portfolio', subjectId: builder.shopId!, fileName: 'bench.jpg', contentType, bytes: photo.length }, s3.storage);
  expect((await putTo(created.uploadUrl, photo, created.headers)).status).toBe(200);
  const incomingKey = (await db('uploads').where({ id: created.uploadId }).first()).object_key;
  const view = await finalizeUpload(db, builder, created.uploadId, s3.storage);
  const row = await db('uploads').where({ id: created.uploadId }).first();
  return { builder, view, row, incomingKey };
}

describe('processing a finalized photo', () => {
  it('strips EXIF, including the GPS position, from the stored image and the thumbnail', async () => {
    const original = await photoJpeg(640, 480, { exif: GPS_EXIF });
    // The original really carries GPS and the camera's name.
    const before = await sharp(original).metadata();
    expect(hasGpsPointer(before.exif)).toBe(true);
    expect(before.exif!.includes(Buffer.from('Quillfeather'))).toBe(true);

    const { row, incomingKey } = await uploadPortfolio(original);
    for (const key of [row.object_key, row.thumb_key]) {
      const stored = await objectBytes(key);
      const meta = await sharp(stored).metadata();
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(stored.includes(Buffer.from('Quillfeather'))).toBe(false);
      expect(stored.includes(Buffer.from('Exif\0\0'))).toBe(false);
    }
    // The original, metadata and all, is deleted.
    expect(await s3.keys(incomingKey)).toEqual([]);
  });

  it('makes a thumbnail no larger than 320 px on its longest side, and records the sizes', async () => {
    const { view, row } = await uploadPortfolio(await photoJpeg(800, 600));
    expect(row).toMatchObject({ status: 'ready', width: 800, height: 600, content_type: 'image/jpeg' });
    expect(view).toMatchObject({ width: 800, height: 600, thumbWidth: 320, thumbHeight: 240, imageUrl: `/api/uploads/${row.id}/image`, thumbUrl: `/api/uploads/${row.id}/thumb` });
    const thumb = await sharp(await objectBytes(row.thumb_key)).metadata();
    expect([thumb.format, thumb.width, thumb.height]).toEqual(['jpeg', 320, 240]);
    expect(row.bytes).toBe((await objectBytes(row.object_key)).length);
    expect(row.object_key).toBe(`public/portfolio/${row.subject_id}/${row.id}.jpg`);
    expect(row.thumb_key).toBe(`public/portfolio/${row.subject_id}/${row.id}-thumb.jpg`);
  });

  it('turns the pixels upright from the EXIF orientation before dropping it', async () => {
    // Stored 640×480 and tagged "rotate 90° clockwise to view" (orientation 6): viewed, it is 480×640.
    const { row } = await uploadPortfolio(await photoJpeg(640, 480, { orientation: 6 }));
    expect([row.width, row.height]).toEqual([480, 640]);
    const meta = await sharp(await objectBytes(row.object_key)).metadata();
    expect([meta.width, meta.height, meta.orientation]).toEqual([480, 640, undefined]);
  });

  it('accepts PNG and WebP and keeps their format', async () => {
    const png = await sharp({ create: { width: 400, height: 200, channels: 4, background: { r: 20, g: 110, b: 100, alpha: 0.5 } } }).png().toBuffer();
    const webp = await sharp({ create: { width: 300, height: 300, channels: 3, background: '#b98a2e' } }).webp().toBuffer();
    const asPng = await uploadPortfolio(png, 'image/png');
    const asWebp = await uploadPortfolio(webp, 'image/webp');
    expect(asPng.view).toMatchObject({ contentType: 'image/png', thumbWidth: 320, thumbHeight: 160 });
    expect(asWebp.view).toMatchObject({ contentType: 'image/webp', thumbWidth: 300, thumbHeight: 300 });
    expect((await sharp(await objectBytes(asWebp.row.thumb_key)).metadata()).format).toBe('webp');
  });

  it('finalizing twice returns the same photo and processes it once', async () => {
    const { builder, view, row } = await uploadPortfolio(await photoJpeg(320, 240));
    const again = await finalizeUpload(db, builder, view.id, s3.storage);
    expect(again).toEqual(view);
    expect(await s3.keys(`public/portfolio/${row.subject_id}/`)).toEqual([row.object_key, row.thumb_key].sort());
  });

  it('two finalize calls at once: both answer with the one ready photo', async () => {
    const builder = await makeBuilder(db);
    const photo = await photoJpeg(320, 240);
    const created = await createUpload(db, builder, { purpose: 'portfolio', subjectId: builder.shopId!, fileName: 'a.jpg', contentType: 'image/jpeg', bytes: photo.length }, s3.storage);
    await putTo(created.uploadUrl, photo, created.headers);
    const [a, b] = await Promise.all([finalizeUpload(db, builder, created.uploadId, s3.storage), finalizeUpload(db, builder, created.uploadId, s3.storage)]);
    expect(a).toEqual(b);
    expect(await s3.keys(`public/portfolio/${builder.shopId}/`)).toHaveLength(2);
  });

  it('streams the clean image and the thumbnail back out of storage', async () => {
    const { row, view } = await uploadPortfolio(await photoJpeg(640, 480, { exif: GPS_EXIF }));
    const image = await readUploadImage(db, null, view.id, 'image', s3.storage);
    expect(image).toMatchObject({ contentType: 'image/jpeg', cacheControl: 'public, max-age=86400, immutable' });
    const bytes = await streamBytes(image.body);
    expect(bytes.equals(await objectBytes(row.object_key))).toBe(true);
    const thumb = await readUploadImage(db, null, view.id, 'thumb', s3.storage);
    expect((await sharp(await streamBytes(thumb.body)).metadata()).width).toBe(320);
  });

  it('clears out unfinished uploads once stale, with what they left in storage, and keeps ready ones', async () => {
    const { row: ready } = await uploadPortfolio(await photoJpeg(160, 120));
    const builder = await makeBuilder(db);
    const photo = await photoJpeg(160, 120);
    const created = await createUpload(db, builder, { purpose: 'portfolio', subjectId: builder.shopId!, fileName: 'a.jpg', contentType: 'image/jpeg', bytes: photo.length }, s3.storage);
    await putTo(created.uploadUrl, photo, created.headers);
    const incoming = (await db('uploads').where({ id: created.uploadId }).first()).object_key;
    await db('uploads').whereIn('id', [created.uploadId, ready.id]).update({ created_at: new Date(Date.now() - 2 * 86_400_000) });

    expect(await discardStaleUploads(db, s3.storage)).toBeGreaterThanOrEqual(1);
    expect(await db('uploads').where({ id: created.uploadId })).toEqual([]);
    expect(await s3.keys(incoming)).toEqual([]);
    expect((await db('uploads').where({ id: ready.id }).first()).status).toBe('ready');
    expect(await s3.keys(ready.object_key)).toEqual([ready.object_key]);
  });
});
