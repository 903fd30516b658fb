import { z } from 'zod';

// Shared by the uploader, the route handlers and the storage functions.

export const UPLOAD_PURPOSES = ['request_photo', 'portfolio', 'shipment_photo'] as const;
export type UploadPurpose = (typeof UPLOAD_PURPOSES)[number];

/** The only image types accepted; the bytes decide, never the name or the declared type. */
export const IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type ImageType = (typeof IMAGE_TYPES)[number];

/** Photos one subject (a request, a shop's portfolio, a job's shipment) may hold. */
export const MAX_PHOTOS_PER_SUBJECT = 24;
/** The longest side of a thumbnail, in pixels. */
export const THUMB_MAX_PX = 320;

const purposeField = z.enum(UPLOAD_PURPOSES, { message: 'Choose what the photo is for.' });
const subjectField = z.uuid({ message: 'That request, shop or job does not exist.' });

export const createUploadSchema = z.object({
  purpose: purposeField,
  subjectId: subjectField,
  fileName: z.string().trim().min(1, 'The file needs a name.').max(255, 'That file name is too long.'),
  contentType: z.enum(IMAGE_TYPES, { message: 'Choose a JPEG, PNG or WebP photo.' }),
  bytes: z.number().int().positive('The file is empty.'),
});
export type CreateUploadInput = z.infer<typeof createUploadSchema>;

export const listUploadsQuerySchema = z.object({ purpose: purposeField, subjectId: subjectField });
export type ListUploadsQuery = z.infer<typeof listUploadsQuerySchema>;

/** What the browser needs to send the file straight to storage. */
export interface CreatedUpload {
  uploadId: string;
  uploadUrl: string;
  /** Send exactly these headers with the PUT; the URL is signed for them. */
  headers: Record<string, string>;
  expiresAt: string;
}

export interface UploadView {
  id: string;
  purpose: UploadPurpose;
  subjectId: string;
  contentType: ImageType;
  bytes: number;
  width: number;
  height: number;
  thumbWidth: number;
  thumbHeight: number;
  imageUrl: string;
  thumbUrl: string;
  createdAt: string;
  /** The viewer uploaded it, so may remove it. */
  canDelete: boolean;
}

export interface UploadList {
  uploads: UploadView[];
  /** The viewer may add photos here. */
  canAttach: boolean;
  maxBytes: number;
  maxPhotos: number;
  acceptedTypes: readonly ImageType[];
}

/** A thumbnail's size for an image of the given size (longest side THUMB_MAX_PX, never enlarged). */
export function thumbSize(width: number, height: number): { width: number; height: number } {
  const scale = Math.min(1, THUMB_MAX_PX / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

export const uploadImageUrl = (id: string) => `/api/uploads/${id}/image`;
export const uploadThumbUrl = (id: string) => `/api/uploads/${id}/thumb`;

/** "8 MB", "1.4 MB", "320 KB": for messages. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${Number((bytes / (1024 * 1024)).toFixed(1))} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} KB`;
}
