import { NotFound } from '@/lib/errors';
import { thumbSize, uploadImageUrl, uploadThumbUrl, type ImageType, type UploadPurpose, type UploadView } from './schema';

export type UploadStatus = 'pending' | 'ready' | 'rejected';

export interface UploadRow {
  id: string;
  owner_id: string;
  purpose: UploadPurpose;
  subject_id: string;
  object_key: string;
  thumb_key: string | null;
  content_type: string;
  bytes: number;
  width: number | null;
  height: number | null;
  status: UploadStatus;
  rejection_reason: string | null;
  created_at: Date;
}

export function toUploadView(row: UploadRow, viewerId: string | null): UploadView {
  const width = row.width ?? 0;
  const height = row.height ?? 0;
  const thumb = thumbSize(width || 1, height || 1);
  return {
    id: row.id,
    purpose: row.purpose,
    subjectId: row.subject_id,
    contentType: row.content_type as ImageType,
    bytes: row.bytes,
    width,
    height,
    thumbWidth: thumb.width,
    thumbHeight: thumb.height,
    imageUrl: uploadImageUrl(row.id),
    thumbUrl: uploadThumbUrl(row.id),
    createdAt: new Date(row.created_at).toISOString(),
    canDelete: viewerId === row.owner_id,
  };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids come from URLs: anything that is not a uuid is simply not found (and never reaches Postgres). */
export function requireUploadId(id: string): string {
  if (!UUID.test(id)) throw new NotFound('Photo not found.');
  return id;
}
