import Image from 'next/image';
import type { UploadView } from '@/lib/storage/schema';

export interface PhotoGalleryProps {
  /** Ready photos, as `listUploads(...).uploads` or `GET /api/uploads` return them. */
  photos: UploadView[];
  /** Names each photo for screen readers: "Portfolio photo 2 of 5". Defaults to "Photo". */
  label?: string;
  /** Shown when there are no photos; nothing is rendered when left out. */
  emptyText?: string;
}

/**
 * Thumbnails in a grid, each linking to the full photo. No client code: fine in server components.
 * The images come through the app (`/api/uploads/<id>/thumb`), which checks who may see them.
 */
export function PhotoGallery({ photos, label = 'Photo', emptyText }: PhotoGalleryProps) {
  if (!photos.length) return emptyText ? <p className="text-sm text-ink-500">{emptyText}</p> : null;
  return (
    <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 md:grid-cols-4">
      {photos.map((photo, i) => (
        <li key={photo.id}>
          <a
            href={photo.imageUrl}
            target="_blank"
            rel="noopener"
            className="relative block aspect-square overflow-hidden rounded border border-chalk-200 bg-chalk-100 shadow-card transition-opacity hover:opacity-90"
          >
            <Image
              src={photo.thumbUrl}
              alt={`${label} ${i + 1} of ${photos.length} (opens full size)`}
              fill
              unoptimized
              sizes="(min-width: 768px) 25vw, 50vw"
              className="object-cover"
            />
          </a>
        </li>
      ))}
    </ul>
  );
}
