import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { canViewSubject } from './access';
import { requireUploadId, type UploadRow } from './rows';
import { defaultStorage, streamObject, type Storage } from './s3';

export interface UploadImage {
  body: ReadableStream;
  contentType: string;
  bytes?: number;
  etag?: string;
  /** Portfolio photos may sit in shared caches; the others only in the viewer's browser. */
  cacheControl: string;
}

/** A ready photo or its thumbnail, streamed from storage, for a viewer allowed to see it (404 otherwise). */
export async function readUploadImage(
  db: Knex,
  viewer: SessionUser | null,
  uploadId: string,
  variant: 'image' | 'thumb',
  storage: Storage = defaultStorage(),
): Promise<UploadImage> {
  requireUploadId(uploadId);
  const row = (await db<UploadRow>('uploads').where({ id: uploadId, status: 'ready' }).first()) as UploadRow | undefined;
  const allowed = row && (viewer?.id === row.owner_id || (await canViewSubject(db, viewer, row.purpose, row.subject_id)));
  if (!row || !allowed) throw new NotFound('Photo not found.');
  const object = await streamObject(storage, variant === 'thumb' ? row.thumb_key! : row.object_key);
  if (!object) throw new NotFound('Photo not found.');
  // A processed photo never changes under its id (a new photo gets a new id), so it can be cached long.
  const cacheControl = row.purpose === 'portfolio' ? 'public, max-age=86400, immutable' : 'private, max-age=3600';
  return { ...object, contentType: row.content_type, cacheControl };
}
