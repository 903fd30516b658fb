import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, Forbidden, NotFound } from '@/lib/errors';
import { assertCanAttach } from './access';
import { UploadRejected, UploadTooLarge } from './errors';
import { cleanImage } from './imaging';
import { requireUploadId, toUploadView, type UploadRow } from './rows';
import { deleteObjects, defaultStorage, objectSize, readObject, writeObject, type Storage } from './s3';
import { formatBytes, type UploadView } from './schema';
import { detectImageType, extensionFor } from './sniff';

type Outcome = { row: UploadRow; discard: string[]; rejection?: UploadRejected | UploadTooLarge };

/**
 * Checks what actually arrived under the upload's key: its size, its type by content, and that it
 * decodes. A good image is re-encoded without metadata, with a thumbnail, under the processed prefix;
 * anything else is deleted and the upload marked rejected with the reason.
 */
export async function finalizeUpload(db: Knex, user: SessionUser, uploadId: string, storage: Storage = defaultStorage()): Promise<UploadView> {
  requireUploadId(uploadId);
  const outcome = await db.transaction(async (trx): Promise<Outcome> => {
    // Locked, so two finalize calls for one upload cannot both process it.
    const row = (await trx<UploadRow>('uploads').where({ id: uploadId }).forUpdate().first()) as UploadRow | undefined;
    if (!row) throw new NotFound('Photo not found.');
    if (row.owner_id !== user.id) throw new Forbidden('Only the person who uploaded this photo can finish the upload.');
    if (row.status === 'ready') return { row, discard: [] };
    if (row.status === 'rejected') throw new Conflict(`This photo was turned down: ${row.rejection_reason}`);
    await assertCanAttach(trx, user, row.purpose, row.subject_id);

    const reject = async (rejection: UploadRejected | UploadTooLarge): Promise<Outcome> => {
      const [updated] = await trx('uploads').where({ id: row.id }).update({ status: 'rejected', rejection_reason: rejection.message }).returning('*');
      return { row: updated, discard: [row.object_key], rejection };
    };
    const tooLarge = (bytes: number | null) =>
      reject(new UploadTooLarge(`The file${bytes ? ` is ${formatBytes(bytes)}, which` : ''} is over the ${formatBytes(storage.maxUploadBytes)} limit for photos.`));
    const notArrived = new Conflict('The photo has not arrived yet. Send the file, then finish the upload.');

    const size = await objectSize(storage, row.object_key);
    if (size === null) throw notArrived;
    if (size > storage.maxUploadBytes) return tooLarge(size);
    const bytes = await readObject(storage, row.object_key, storage.maxUploadBytes);
    if (bytes === null) throw notArrived;
    if (bytes === 'too-large') return tooLarge(null);

    const type = detectImageType(bytes);
    if (!type) return reject(new UploadRejected('This file is not a JPEG, PNG or WebP image, whatever its name says.'));
    let clean;
    try {
      clean = await cleanImage(bytes, type);
    } catch {
      return reject(new UploadRejected('This image is damaged or incomplete, so it could not be read.'));
    }

    const base = `public/${row.purpose}/${row.subject_id}/${row.id}`;
    const imageKey = `${base}.${extensionFor[type]}`;
    const thumbKey = `${base}-thumb.${extensionFor[type]}`;
    await writeObject(storage, imageKey, clean.image, type);
    await writeObject(storage, thumbKey, clean.thumb, type);
    const [updated] = await trx('uploads')
      .where({ id: row.id })
      .update({ status: 'ready', object_key: imageKey, thumb_key: thumbKey, content_type: type, bytes: clean.image.length, width: clean.width, height: clean.height })
      .returning('*');
    return { row: updated, discard: [row.object_key] };
  });
  // The original (with its metadata) goes once the new state is committed.
  await deleteObjects(storage, outcome.discard);
  if (outcome.rejection) throw outcome.rejection;
  return toUploadView(outcome.row, user.id);
}
