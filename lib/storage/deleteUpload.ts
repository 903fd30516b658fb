import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden, NotFound } from '@/lib/errors';
import { requireUploadId, type UploadRow } from './rows';
import { defaultStorage, deleteObjects, type Storage } from './s3';

/** Removes a photo (any status) and its stored objects; only the person who uploaded it may. */
export async function deleteUpload(db: Knex, user: SessionUser, uploadId: string, storage: Storage = defaultStorage()): Promise<void> {
  requireUploadId(uploadId);
  const row = await db.transaction(async (trx) => {
    const found = (await trx<UploadRow>('uploads').where({ id: uploadId }).forUpdate().first()) as UploadRow | undefined;
    if (!found) throw new NotFound('Photo not found.');
    if (found.owner_id !== user.id) throw new Forbidden('Only the person who uploaded this photo can remove it.');
    await trx('uploads').where({ id: uploadId }).delete();
    return found;
  });
  await deleteObjects(storage, [row.object_key, row.thumb_key]);
}
