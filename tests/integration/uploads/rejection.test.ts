import { PutObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createUpload } from '@/lib/storage/createUpload';
import { UploadRejected, UploadTooLarge } from '@/lib/storage/errors';
import { finalizeUpload } from '@/lib/storage/finalizeUpload';
import { testDb } from '../../support/db';
import { makeRider, makeRequest, photoJpeg, putTo, startS3, TEST_MAX_BYTES, type S3Harness } from './support';

const db = testDb();
let s3: S3Harness;
beforeAll(async () => {
  s3 = await startS3();
});
afterAll(async () => {
  await s3.stop();
  await db.destroy();
});

async function riderWithRequest() {
  const rider = await makeRider(db);
  return { rider, requestId: await makeRequest(db, rider) };
}

/** Creates an upload declaring `declared`, sends `body` through the presigned URL, then finalizes. */
async function sendAndFinalize(body: Buffer, declared: { fileName: string; contentType: 'image/jpeg' | 'image/png' | 'image/webp' }) {
  const { rider, requestId } = await riderWithRequest();
  const created = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, bytes: body.length, ...declared }, s3.storage);
  const put = await putTo(created.uploadUrl, body, created.headers);
  expect(put.status).toBe(200);
  const error = await finalizeUpload(db, rider, created.uploadId, s3.storage).catch((e) => e);
  const row = await db('uploads').where({ id: created.uploadId }).first();
  return { rider, created, error, row };
}

describe('upload rejections', () => {
  it('rejects a text file named photo.jpg and declared as a JPEG: the bytes decide', async () => {
    const { error, row, created, rider } = await sendAndFinalize(Buffer.from('these are frame measurements, not a photo\n'.repeat(20)), { fileName: 'photo.jpg', contentType: 'image/jpeg' });
    expect(error).toBeInstanceOf(UploadRejected);
    expect(error.status).toBe(422);
    expect(error.message).toBe('This file is not a JPEG, PNG or WebP image, whatever its name says.');
    expect(row).toMatchObject({ status: 'rejected', rejection_reason: error.message, thumb_key: null });
    // The stored bytes are gone; nothing reached the processed area.
    expect(await s3.keys(row.object_key)).toEqual([]);
    expect(await s3.keys(`public/request_photo/${row.subject_id}/`)).toEqual([]);
    // A second finalize explains it was turned down.
    await expect(finalizeUpload(db, rider, created.uploadId, s3.storage)).rejects.toThrow(/turned down/);
  });

  it('keeps a PNG declared as a JPEG as the PNG its bytes say it is', async () => {
    const png = await sharp({ create: { width: 50, height: 40, channels: 3, background: '#8a5' } }).png().toBuffer();
    const { rider, requestId } = await riderWithRequest();
    const created = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'dropout.jpg', contentType: 'image/jpeg', bytes: png.length }, s3.storage);
    await putTo(created.uploadUrl, png, created.headers);
    const view = await finalizeUpload(db, rider, created.uploadId, s3.storage);
    expect(view.contentType).toBe('image/png');
    expect((await db('uploads').where({ id: created.uploadId }).first()).object_key).toMatch(/\.png$/);
  });

  it('refuses a declared type that is not an accepted image, whatever the name', async () => {
    const { rider, requestId } = await riderWithRequest();
    const err = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'frame.jpg', contentType: 'image/gif' as never, bytes: 1000 }, s3.storage).catch((e) => e);
    expect(err.name).toBe('ZodError');
    expect(JSON.stringify(err.issues)).toContain('Choose a JPEG, PNG or WebP photo.');
  });

  it('rejects an oversized file when it is declared, before any URL is handed out', async () => {
    const { rider, requestId } = await riderWithRequest();
    const err = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'huge.jpg', contentType: 'image/jpeg', bytes: TEST_MAX_BYTES + 1 }, s3.storage).catch((e) => e);
    expect(err).toBeInstanceOf(UploadTooLarge);
    expect(err.status).toBe(413);
    expect(err.message).toBe('huge.jpg is too large: photos can be at most 200 KB.');
    expect(await db('uploads').where({ subject_id: requestId })).toEqual([]);
  });

  it('the presigned URL only takes the declared length: a bigger body is refused by the store', async () => {
    const { rider, requestId } = await riderWithRequest();
    const small = await photoJpeg(64, 48);
    const created = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'a.jpg', contentType: 'image/jpeg', bytes: small.length }, s3.storage);
    const bigger = Buffer.concat([small, Buffer.alloc(TEST_MAX_BYTES)]);
    expect((await putTo(created.uploadUrl, bigger, created.headers)).status).toBe(403);
    expect(await s3.keys(`incoming/${rider.id}/`)).toEqual([]);
  });

  it('rejects at finalize when the stored object is over the cap even though the declared size was not', async () => {
    // A store that does not enforce the signed length (or a client that bypassed the URL) is caught here.
    const { rider, requestId } = await riderWithRequest();
    const created = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'liar.jpg', contentType: 'image/jpeg', bytes: 10_000 }, s3.storage);
    const row = await db('uploads').where({ id: created.uploadId }).first();
    const oversized = Buffer.concat([await photoJpeg(64, 48), Buffer.alloc(TEST_MAX_BYTES)]);
    await s3.storage.client.send(new PutObjectCommand({ Bucket: s3.fake.bucket, Key: row.object_key, Body: oversized, ContentType: 'image/jpeg' }));
    const err = await finalizeUpload(db, rider, created.uploadId, s3.storage).catch((e) => e);
    expect(err).toBeInstanceOf(UploadTooLarge);
    expect(err.message).toMatch(/is over the 200 KB limit for photos/);
    expect(await db('uploads').where({ id: created.uploadId }).first()).toMatchObject({ status: 'rejected' });
    expect(await s3.keys(row.object_key)).toEqual([]);
  });

  it('rejects a corrupt image: a JPEG cut off half way', async () => {
    const whole = await photoJpeg(320, 240);
    const { error, row } = await sendAndFinalize(whole.subarray(0, Math.floor(whole.length / 2)), { fileName: 'cut.jpg', contentType: 'image/jpeg' });
    expect(error).toBeInstanceOf(UploadRejected);
    expect(error.message).toBe('This image is damaged or incomplete, so it could not be read.');
    expect(row.status).toBe('rejected');
    expect(await s3.keys(`public/request_photo/${row.subject_id}/`)).toEqual([]);
  });

  it('rejects a corrupt image: the right magic bytes followed by noise', async () => {
    const noise = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(2000, 0x5a)]);
    const { error, row } = await sendAndFinalize(noise, { fileName: 'wheel.png', contentType: 'image/png' });
    expect(error).toBeInstanceOf(UploadRejected);
    expect(error.message).toBe('This image is damaged or incomplete, so it could not be read.');
    expect(row.status).toBe('rejected');
  });

  it('finalizing before the file arrives is a 409 and leaves the upload pending, so it can be retried', async () => {
    const { rider, requestId } = await riderWithRequest();
    const photo = await photoJpeg(64, 48);
    const created = await createUpload(db, rider, { purpose: 'request_photo', subjectId: requestId, fileName: 'a.jpg', contentType: 'image/jpeg', bytes: photo.length }, s3.storage);
    const err = await finalizeUpload(db, rider, created.uploadId, s3.storage).catch((e) => e);
    expect(err.status).toBe(409);
    expect(err.message).toBe('The photo has not arrived yet. Send the file, then finish the upload.');
    expect((await db('uploads').where({ id: created.uploadId }).first()).status).toBe('pending');
    await putTo(created.uploadUrl, photo, created.headers);
    expect((await finalizeUpload(db, rider, created.uploadId, s3.storage)).id).toBe(created.uploadId);
  });
});
