import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, Forbidden, NotFound } from '@/lib/errors';
import { createUpload } from '@/lib/storage/createUpload';
import { deleteUpload } from '@/lib/storage/deleteUpload';
import { finalizeUpload } from '@/lib/storage/finalizeUpload';
import { listUploads } from '@/lib/storage/listUploads';
import { readUploadImage } from '@/lib/storage/readUploadImage';
import { MAX_PHOTOS_PER_SUBJECT, type UploadPurpose } from '@/lib/storage/schema';
import { testDb } from '../../support/db';
import { addShopMember, makeAdmin, makeBuilder, makeJob, makeRequest, makeRider, photoJpeg, putTo, startS3, type S3Harness } from './support';

const db = testDb();
let s3: S3Harness;
let photo: Buffer;
beforeAll(async () => {
  s3 = await startS3();
  photo = await photoJpeg(160, 120);
});
afterAll(async () => {
  await s3.stop();
  await db.destroy();
});

const create = (user: SessionUser, purpose: UploadPurpose, subjectId: string) =>
  createUpload(db, user, { purpose, subjectId, fileName: 'p.jpg', contentType: 'image/jpeg', bytes: photo.length }, s3.storage);

async function readyPhoto(user: SessionUser, purpose: UploadPurpose, subjectId: string) {
  const created = await create(user, purpose, subjectId);
  await putTo(created.uploadUrl, photo, created.headers);
  return finalizeUpload(db, user, created.uploadId, s3.storage);
}

const canRead = (viewer: SessionUser | null, id: string) =>
  readUploadImage(db, viewer, id, 'thumb', s3.storage).then(
    async (img) => {
      await img.body.cancel();
      return true;
    },
    (err) => {
      if (err instanceof NotFound) return false;
      throw err;
    },
  );

describe('who may attach photos', () => {
  it('a rider attaches to their own request only', async () => {
    const [rider, other, builder, admin] = [await makeRider(db), await makeRider(db), await makeBuilder(db), await makeAdmin(db)];
    const requestId = await makeRequest(db, rider);
    await expect(create(rider, 'request_photo', requestId)).resolves.toMatchObject({ uploadId: expect.any(String) });
    for (const outsider of [other, builder, admin]) await expect(create(outsider, 'request_photo', requestId)).rejects.toThrow(Forbidden);
    await expect(create(rider, 'request_photo', crypto.randomUUID())).rejects.toThrow(NotFound);
    const cancelled = await makeRequest(db, rider, 'cancelled');
    await expect(create(rider, 'request_photo', cancelled)).rejects.toThrow(Conflict);
  });

  it('a builder adds portfolio photos to their own shop only; a second member may too', async () => {
    const [builder, otherBuilder, rider] = [await makeBuilder(db), await makeBuilder(db), await makeRider(db)];
    const colleague = await addShopMember(db, builder.shopId!);
    await expect(create(builder, 'portfolio', builder.shopId!)).resolves.toBeDefined();
    await expect(create(colleague, 'portfolio', builder.shopId!)).resolves.toBeDefined();
    await expect(create(otherBuilder, 'portfolio', builder.shopId!)).rejects.toThrow(Forbidden);
    await expect(create(rider, 'portfolio', builder.shopId!)).rejects.toThrow(Forbidden);
    // A rider cannot pass a shop id off as one of their requests, or the other way round.
    await expect(create(builder, 'request_photo', builder.shopId!)).rejects.toThrow(NotFound);
  });

  it('shipment photos go on the job only from the shop building it', async () => {
    const [rider, builder, otherBuilder] = [await makeRider(db), await makeBuilder(db), await makeBuilder(db)];
    const jobId = await makeJob(db, rider, builder);
    await expect(create(builder, 'shipment_photo', jobId)).resolves.toBeDefined();
    await expect(create(otherBuilder, 'shipment_photo', jobId)).rejects.toThrow(Forbidden);
    await expect(create(rider, 'shipment_photo', jobId)).rejects.toThrow(Forbidden);
  });

  it('caps the photos one subject holds', async () => {
    const builder = await makeBuilder(db);
    await db('uploads').insert(
      Array.from({ length: MAX_PHOTOS_PER_SUBJECT }, (_, i) => ({
        owner_id: builder.id,
        purpose: 'portfolio',
        subject_id: builder.shopId,
        object_key: `public/portfolio/${builder.shopId}/filler-${i}.jpg`,
        thumb_key: `public/portfolio/${builder.shopId}/filler-${i}-thumb.jpg`,
        content_type: 'image/jpeg',
        bytes: 1,
        width: 1,
        height: 1,
        status: 'ready',
      })),
    );
    await expect(create(builder, 'portfolio', builder.shopId!)).rejects.toThrow(`There are already ${MAX_PHOTOS_PER_SUBJECT} photos here. Remove one to add another.`);
  });
});

describe('presigned URLs and object keys', () => {
  it('keys live under the owner’s own incoming prefix and the URL is signed for that key only', async () => {
    const rider = await makeRider(db);
    const requestId = await makeRequest(db, rider);
    const created = await create(rider, 'request_photo', requestId);
    const row = await db('uploads').where({ id: created.uploadId }).first();
    expect(row.object_key).toMatch(new RegExp(`^incoming/${rider.id}/[0-9a-f-]{36}$`));
    const url = new URL(created.uploadUrl);
    expect(url.pathname).toBe(`/${s3.fake.bucket}/${row.object_key}`);
    expect(url.searchParams.get('X-Amz-SignedHeaders')).toBe('content-length;content-type;host');
    expect(Number(url.searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(600);

    // The same signature cannot write anywhere else: another owner's prefix, or the processed area.
    const victim = await makeRider(db);
    for (const key of [`incoming/${victim.id}/${crypto.randomUUID()}`, `public/request_photo/${requestId}/x.jpg`]) {
      const forged = new URL(created.uploadUrl);
      forged.pathname = `/${s3.fake.bucket}/${key}`;
      expect((await putTo(forged.toString(), photo, created.headers)).status).toBe(403);
    }
    // Nor with another type than the one declared.
    expect((await putTo(created.uploadUrl, photo, { 'Content-Type': 'image/png' })).status).toBe(403);
    expect(await s3.keys(`incoming/${victim.id}/`)).toEqual([]);
    expect(await s3.keys('public/')).not.toContain(`public/request_photo/${requestId}/x.jpg`);
    expect((await putTo(created.uploadUrl, photo, created.headers)).status).toBe(200);
  });

  it('nobody but the owner finalizes or deletes an upload', async () => {
    const [builder, otherBuilder, admin] = [await makeBuilder(db), await makeBuilder(db), await makeAdmin(db)];
    const colleague = await addShopMember(db, builder.shopId!);
    const created = await create(builder, 'portfolio', builder.shopId!);
    await putTo(created.uploadUrl, photo, created.headers);
    for (const other of [otherBuilder, colleague, admin]) {
      await expect(finalizeUpload(db, other, created.uploadId, s3.storage)).rejects.toThrow(Forbidden);
    }
    expect((await db('uploads').where({ id: created.uploadId }).first()).status).toBe('pending');
    const view = await finalizeUpload(db, builder, created.uploadId, s3.storage);
    for (const other of [otherBuilder, colleague, admin]) await expect(deleteUpload(db, other, view.id, s3.storage)).rejects.toThrow(Forbidden);
    await expect(finalizeUpload(db, builder, 'not-a-uuid', s3.storage)).rejects.toThrow(NotFound);

    await deleteUpload(db, builder, view.id, s3.storage);
    expect(await db('uploads').where({ id: view.id })).toEqual([]);
    expect(await s3.keys(`public/portfolio/${builder.shopId}/`)).toEqual([]);
  });
});

describe('who may see photos', () => {
  it('portfolio photos are public, and listed for anyone', async () => {
    const builder = await makeBuilder(db);
    const view = await readyPhoto(builder, 'portfolio', builder.shopId!);
    expect(await canRead(null, view.id)).toBe(true);
    expect(await canRead(await makeRider(db), view.id)).toBe(true);
    const list = await listUploads(db, null, { purpose: 'portfolio', subjectId: builder.shopId! }, s3.storage);
    expect(list).toMatchObject({ canAttach: false, maxBytes: s3.storage.maxUploadBytes, acceptedTypes: ['image/jpeg', 'image/png', 'image/webp'] });
    expect(list.uploads.map((u) => [u.id, u.canDelete])).toEqual([[view.id, false]]);
    const own = await listUploads(db, builder, { purpose: 'portfolio', subjectId: builder.shopId! }, s3.storage);
    expect(own.canAttach).toBe(true);
    expect(own.uploads[0].canDelete).toBe(true);
  });

  it('request photos: the rider, admins and builders who may see the request; not other riders or visitors', async () => {
    const [rider, otherRider, builder, admin] = [await makeRider(db), await makeRider(db), await makeBuilder(db), await makeAdmin(db)];
    const requestId = await makeRequest(db, rider);
    const view = await readyPhoto(rider, 'request_photo', requestId);
    expect(await canRead(rider, view.id)).toBe(true);
    expect(await canRead(admin, view.id)).toBe(true);
    expect(await canRead(builder, view.id)).toBe(true); // open on the board, so builders can bid on what they see
    expect(await canRead(otherRider, view.id)).toBe(false);
    expect(await canRead(null, view.id)).toBe(false);
    await expect(listUploads(db, otherRider, { purpose: 'request_photo', subjectId: requestId }, s3.storage)).rejects.toThrow(NotFound);
    await expect(listUploads(db, null, { purpose: 'request_photo', subjectId: requestId }, s3.storage)).rejects.toThrow(NotFound);

    // Once the request closes, an uninvolved builder no longer sees it or its photos.
    await db('wheel_requests').where({ id: requestId }).update({ status: 'cancelled' });
    expect(await canRead(builder, view.id)).toBe(false);
    expect(await canRead(rider, view.id)).toBe(true);
  });

  it('shipment photos: the job’s rider, the shop’s members and admins only', async () => {
    const [rider, builder, otherBuilder, otherRider, admin] = [await makeRider(db), await makeBuilder(db), await makeBuilder(db), await makeRider(db), await makeAdmin(db)];
    const colleague = await addShopMember(db, builder.shopId!);
    const jobId = await makeJob(db, rider, builder);
    const view = await readyPhoto(builder, 'shipment_photo', jobId);
    for (const allowed of [rider, builder, colleague, admin]) expect(await canRead(allowed, view.id)).toBe(true);
    for (const refused of [otherBuilder, otherRider, null]) expect(await canRead(refused, view.id)).toBe(false);
    const list = await listUploads(db, rider, { purpose: 'shipment_photo', subjectId: jobId }, s3.storage);
    expect(list.uploads.map((u) => u.id)).toEqual([view.id]);
    expect(list.canAttach).toBe(false);
  });

  it('pending and rejected uploads are never served or listed', async () => {
    const builder = await makeBuilder(db);
    const created = await create(builder, 'portfolio', builder.shopId!);
    await putTo(created.uploadUrl, photo, created.headers);
    expect(await canRead(builder, created.uploadId)).toBe(false);
    expect((await listUploads(db, builder, { purpose: 'portfolio', subjectId: builder.shopId! }, s3.storage)).uploads).toEqual([]);
  });
});
