import 'server-only';
import crypto from 'node:crypto';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict } from '@/lib/errors';
import { assertCanAttach } from './access';
import { UploadTooLarge } from './errors';
import { defaultStorage, presignPut, type Storage } from './s3';
import { createUploadSchema, formatBytes, MAX_PHOTOS_PER_SUBJECT, type CreatedUpload, type CreateUploadInput } from './schema';

/** Long enough for a large photo on a slow line, short enough that a leaked URL soon goes stale. */
const PUT_URL_SECONDS = 10 * 60;
/** Unfinished uploads older than this no longer hold a place under the per-subject cap. */
const PENDING_COUNTS_FOR_MS = 60 * 60 * 1000;

/**
 * Records a pending upload and returns a presigned PUT for it. The object key is made here, under the
 * owner's own prefix, and the URL is signed for that key, the declared type and the declared length.
 */
export async function createUpload(db: Knex, user: SessionUser, input: CreateUploadInput, storage: Storage = defaultStorage()): Promise<CreatedUpload> {
  const { purpose, subjectId, fileName, contentType, bytes } = createUploadSchema.parse(input);
  if (bytes > storage.maxUploadBytes) {
    throw new UploadTooLarge(`${fileName} is too large: photos can be at most ${formatBytes(storage.maxUploadBytes)}.`);
  }
  await assertCanAttach(db, user, purpose, subjectId);

  const held = await db('uploads')
    .where({ purpose, subject_id: subjectId })
    .andWhere((q) => q.where('status', 'ready').orWhere((p) => p.where('status', 'pending').andWhere('created_at', '>', new Date(Date.now() - PENDING_COUNTS_FOR_MS))))
    .count<{ count: string }[]>('id as count');
  if (Number(held[0].count) >= MAX_PHOTOS_PER_SUBJECT) throw new Conflict(`There are already ${MAX_PHOTOS_PER_SUBJECT} photos here. Remove one to add another.`);

  const key = `incoming/${user.id}/${crypto.randomUUID()}`;
  const [row] = await db('uploads')
    .insert({ owner_id: user.id, purpose, subject_id: subjectId, object_key: key, content_type: contentType, bytes, status: 'pending' })
    .returning(['id']);
  const uploadUrl = await presignPut(storage, key, contentType, bytes, PUT_URL_SECONDS);
  return {
    uploadId: row.id,
    uploadUrl,
    headers: { 'Content-Type': contentType },
    expiresAt: new Date(Date.now() + PUT_URL_SECONDS * 1000).toISOString(),
  };
}
