import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { canAttach, canViewSubject } from './access';
import { toUploadView, type UploadRow } from './rows';
import { defaultStorage, type Storage } from './s3';
import { IMAGE_TYPES, listUploadsQuerySchema, MAX_PHOTOS_PER_SUBJECT, type ListUploadsQuery, type UploadList } from './schema';

/** The ready photos of one request, shop portfolio or job, oldest first, for anyone who may see them. */
export async function listUploads(db: Knex, viewer: SessionUser | null, query: ListUploadsQuery, storage: Storage = defaultStorage()): Promise<UploadList> {
  const { purpose, subjectId } = listUploadsQuerySchema.parse(query);
  if (!(await canViewSubject(db, viewer, purpose, subjectId))) throw new NotFound('Photos not found.');
  const rows = (await db<UploadRow>('uploads').where({ purpose, subject_id: subjectId, status: 'ready' }).orderBy([{ column: 'created_at' }, { column: 'id' }])) as UploadRow[];
  return {
    uploads: rows.map((row) => toUploadView(row, viewer?.id ?? null)),
    canAttach: await canAttach(db, viewer, purpose, subjectId),
    maxBytes: storage.maxUploadBytes,
    maxPhotos: MAX_PHOTOS_PER_SUBJECT,
    acceptedTypes: IMAGE_TYPES,
  };
}
