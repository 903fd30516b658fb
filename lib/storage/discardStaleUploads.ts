import 'server-only';
import type { Knex } from 'knex';
import type { UploadRow } from './rows';
import { defaultStorage, deleteObjects, type Storage } from './s3';

/** Unfinished uploads are kept this long (the PUT link lasts minutes; a retry may take a while longer). */
export const STALE_UPLOAD_MS = 24 * 60 * 60 * 1000;

/**
 * Deletes uploads that never finished and refused ones, once older than `olderThanMs`, with whatever
 * they left in storage. For a periodic job; returns how many went.
 */
export async function discardStaleUploads(db: Knex, storage: Storage = defaultStorage(), olderThanMs = STALE_UPLOAD_MS, batch = 200): Promise<number> {
  const cutoff = new Date(Date.now() - olderThanMs);
  const rows = (await db<UploadRow>('uploads')
    .whereIn('status', ['pending', 'rejected'])
    .andWhere('created_at', '<', cutoff)
    .orderBy('created_at')
    .limit(batch)
    .select('id', 'object_key', 'thumb_key')) as Pick<UploadRow, 'id' | 'object_key' | 'thumb_key'>[];
  if (!rows.length) return 0;
  await deleteObjects(storage, rows.flatMap((r) => [r.object_key, r.thumb_key]));
  // Only rows still unfinished: one finalized meanwhile stays.
  return db('uploads').whereIn('id', rows.map((r) => r.id)).whereIn('status', ['pending', 'rejected']).delete();
}
