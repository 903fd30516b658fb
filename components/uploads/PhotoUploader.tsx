'use client';

// Add photos to a request, a shop's portfolio or a job: pick or drop files, each goes straight to the
// photo store with a progress bar, then the server checks and cleans it. Shows the subject's photos
// with remove buttons for the viewer's own. Works with or without a QueryProvider above it.
import { QueryClientContext, useQueryClient } from '@tanstack/react-query';
import Image from 'next/image';
import { useContext, useEffect, useId, useRef, useState, type DragEvent } from 'react';
import { ApiError, fetchJson } from '@/components/market/builder/fetchJson';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { Button, buttonClass } from '@/components/ui/Button';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { formatBytes, type CreatedUpload, type UploadList, type UploadPurpose, type UploadView } from '@/lib/storage/schema';
import { SendError, sendFile, type Sending } from './sendFile';
import { uploadsKey, useUploads } from './useUploads';

export interface PhotoUploaderProps {
  /** What the photos are for: a rider's request, a shop's portfolio, or a job's finished wheel. */
  purpose: UploadPurpose;
  /** The request id, shop id or job id the photos belong to. */
  subjectId: string;
  /** Called with the subject's ready photos after one is added or removed (not on first load). */
  onChange?: (photos: UploadView[]) => void;
  /** Heading over the uploader; a default suits each purpose. */
  title?: string;
  /** A line under the heading; a default suits each purpose. */
  description?: string;
}

const DEFAULT_TEXT: Record<UploadPurpose, { title: string; description: string }> = {
  request_photo: { title: 'Frame and dropout photos', description: 'Show the frame, the dropouts and any parts you already have: close, sharp and well lit.' },
  portfolio: { title: 'Portfolio photos', description: 'Wheels your shop has built. These are public on your shop page.' },
  shipment_photo: { title: 'Photos of the finished wheel', description: 'The wheel before it goes in the box, and the packed box. The rider sees these.' },
};

type Phase = 'starting' | 'sending' | 'finishing' | 'failed';

interface Item {
  localId: string;
  file: File;
  previewUrl: string;
  phase: Phase;
  progress: number;
  error?: string;
  /** A fresh attempt could succeed (a network hiccup, an expired link); false for a refused file. */
  retryable?: boolean;
  created?: CreatedUpload;
  sent?: boolean;
}

export function PhotoUploader(props: PhotoUploaderProps) {
  const hasClient = useContext(QueryClientContext) !== undefined;
  if (hasClient) return <Uploader {...props} />;
  return (
    <QueryProvider>
      <Uploader {...props} />
    </QueryProvider>
  );
}

function messageFor(err: unknown): string {
  if (err instanceof ApiError) return Object.values(err.fieldErrors)[0]?.[0] ?? err.message;
  if (err instanceof Error) return err.message;
  return 'Something went wrong. Try again.';
}

function Uploader({ purpose, subjectId, onChange, title, description }: PhotoUploaderProps) {
  const text = DEFAULT_TEXT[purpose];
  const queryClient = useQueryClient();
  const key = uploadsKey(purpose, subjectId);
  const list = useUploads(purpose, subjectId);
  const [items, setItems] = useState<Item[]>([]);
  const [notice, setNotice] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [dragging, setDragging] = useState(false);
  const sending = useRef(new Map<string, Sending>());
  const itemsRef = useRef(items);
  const inputId = useId();
  const headingId = useId();

  useEffect(() => {
    itemsRef.current = items;
  }, [items]);
  // Object URLs for previews hold the file in memory until revoked.
  useEffect(() => () => itemsRef.current.forEach((i) => URL.revokeObjectURL(i.previewUrl)), []);

  const update = (localId: string, patch: Partial<Item>) => setItems((all) => all.map((i) => (i.localId === localId ? { ...i, ...patch } : i)));
  const drop = (localId: string) =>
    setItems((all) => {
      const gone = all.find((i) => i.localId === localId);
      if (gone) URL.revokeObjectURL(gone.previewUrl);
      return all.filter((i) => i.localId !== localId);
    });

  const changed = (next: UploadView[]) => {
    queryClient.setQueryData<UploadList>(key, (old) => (old ? { ...old, uploads: next } : old));
    onChange?.(next);
  };
  const current = () => queryClient.getQueryData<UploadList>(key)?.uploads ?? [];

  /** Best effort: an unfinished upload the viewer gave up on need not wait to age out. */
  const discard = (created?: CreatedUpload) => {
    if (created) void fetchJson(`/api/uploads/${created.uploadId}`, { method: 'DELETE' }).catch(() => undefined);
  };

  async function run(item: Item) {
    let { created, sent } = item;
    try {
      if (!created) {
        update(item.localId, { phase: 'starting', error: undefined, progress: 0 });
        created = await fetchJson<CreatedUpload>('/api/uploads', {
          method: 'POST',
          json: { purpose, subjectId, fileName: item.file.name, contentType: item.file.type, bytes: item.file.size },
        });
        update(item.localId, { created });
      }
      if (!sent) {
        update(item.localId, { phase: 'sending', error: undefined, progress: 0 });
        const s = sendFile(created.uploadUrl, item.file, created.headers, (progress) => update(item.localId, { progress }));
        sending.current.set(item.localId, s);
        await s.done.finally(() => sending.current.delete(item.localId));
        sent = true;
        update(item.localId, { sent });
      }
      update(item.localId, { phase: 'finishing', error: undefined, progress: 1 });
      const photo = await fetchJson<UploadView>(`/api/uploads/${created.uploadId}/finalize`, { method: 'POST' });
      drop(item.localId);
      changed([...current().filter((p) => p.id !== photo.id), photo]);
    } catch (err) {
      if (err instanceof SendError && err.message === 'Upload cancelled.') return;
      let retryable = true;
      const patch: Partial<Item> = {};
      if (err instanceof SendError && err.urlRefused) {
        discard(created);
        patch.created = undefined; // the next try asks for a fresh link
      } else if (err instanceof ApiError) {
        if (err.status === 409 && created) patch.sent = false; // the file never landed: send it again
        else if (err.status !== 0 && err.status < 500) retryable = false; // refused: a retry would be refused too
      }
      update(item.localId, { ...patch, phase: 'failed', error: messageFor(err), retryable });
    }
  }

  function addFiles(files: File[]) {
    setNotice(null);
    const data = list.data;
    if (!data || !files.length) return;
    const room = data.maxPhotos - data.uploads.length - items.filter((i) => i.phase !== 'failed').length;
    if (files.length > room) setNotice(room > 0 ? `Only ${room} more photo${room === 1 ? '' : 's'} fit here; the rest were left out.` : 'There is no room for more photos here. Remove one first.');
    const fresh: Item[] = files.slice(0, Math.max(0, room)).map((file) => {
      const item: Item = { localId: crypto.randomUUID(), file, previewUrl: URL.createObjectURL(file), phase: 'starting', progress: 0 };
      // Checked here for a quick answer; the server checks again, and by the file's content.
      if (!(data.acceptedTypes as readonly string[]).includes(file.type)) {
        return { ...item, phase: 'failed', retryable: false, error: `${file.name} is not a JPEG, PNG or WebP photo.` };
      }
      if (file.size === 0) return { ...item, phase: 'failed', retryable: false, error: `${file.name} is empty.` };
      if (file.size > data.maxBytes) {
        return { ...item, phase: 'failed', retryable: false, error: `${file.name} is ${formatBytes(file.size)}; photos can be at most ${formatBytes(data.maxBytes)}.` };
      }
      return item;
    });
    setItems((all) => [...all, ...fresh]);
    for (const item of fresh) if (item.phase !== 'failed') void run(item);
  }

  function cancel(item: Item) {
    sending.current.get(item.localId)?.abort();
    discard(item.created);
    drop(item.localId);
  }

  async function remove(photo: UploadView) {
    setConfirming(null);
    try {
      await fetchJson(`/api/uploads/${photo.id}`, { method: 'DELETE' });
      changed(current().filter((p) => p.id !== photo.id));
    } catch (err) {
      setNotice(messageFor(err));
    }
  }

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    addFiles(Array.from(e.dataTransfer.files));
  };

  const data = list.data;
  return (
    <section aria-labelledby={headingId} className="space-y-3">
      <div>
        <h2 id={headingId} className="font-display text-lg font-semibold text-ink-900">
          {title ?? text.title}
        </h2>
        <p className="text-sm text-ink-500">{description ?? text.description}</p>
      </div>

      {list.isPending && <Spinner label="Loading photos…" />}
      {list.isError && <Notice tone="danger">{messageFor(list.error)}</Notice>}

      {data?.canAttach && (
        <div
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={`flex flex-wrap items-center gap-3 rounded-lg border-2 border-dashed px-4 py-4 ${dragging ? 'border-petrol-500 bg-petrol-50' : 'border-chalk-300 bg-chalk-50'}`}
        >
          <label htmlFor={inputId} className={buttonClass('secondary', 'cursor-pointer')}>
            Choose photos
          </label>
          <input
            id={inputId}
            type="file"
            multiple
            accept={data.acceptedTypes.join(',')}
            className="sr-only"
            onChange={(e) => {
              addFiles(Array.from(e.target.files ?? []));
              e.target.value = '';
            }}
          />
          <p className="text-sm text-ink-500">
            or drop them here. JPEG, PNG or WebP, up to {formatBytes(data.maxBytes)} each. Location and camera details are removed from every photo.
          </p>
        </div>
      )}

      {notice && <Notice tone="caution">{notice}</Notice>}

      {(items.length > 0 || (data && data.uploads.length > 0)) && (
        <ul className="grid grid-cols-2 items-start gap-3 sm:grid-cols-3 md:grid-cols-4" aria-label="Photos">
          {data?.uploads.map((photo, i) => (
            <li key={photo.id} className="overflow-hidden rounded border border-chalk-200 bg-white">
              <a href={photo.imageUrl} target="_blank" rel="noopener" className="relative block aspect-square bg-chalk-100">
                <Image src={photo.thumbUrl} alt={`Photo ${i + 1} (opens full size)`} fill unoptimized sizes="(min-width: 768px) 25vw, 50vw" className="object-cover" />
              </a>
              {photo.canDelete && (
                <div className="flex justify-end gap-1 p-1">
                  {confirming === photo.id ? (
                    <>
                      <Button tone="danger" className="px-2 py-1 text-xs" onClick={() => void remove(photo)}>
                        Remove
                      </Button>
                      <Button tone="quiet" className="px-2 py-1 text-xs" onClick={() => setConfirming(null)}>
                        Keep
                      </Button>
                    </>
                  ) : (
                    <Button tone="quiet" className="px-2 py-1 text-xs" onClick={() => setConfirming(photo.id)} aria-label={`Remove photo ${i + 1}`}>
                      Remove…
                    </Button>
                  )}
                </div>
              )}
            </li>
          ))}
          {items.map((item) => (
            <UploadingTile key={item.localId} item={item} onRetry={() => void run(item)} onCancel={() => cancel(item)} />
          ))}
        </ul>
      )}

      {data && data.uploads.length === 0 && items.length === 0 && <p className="text-sm text-ink-500">No photos yet.</p>}
    </section>
  );
}

const PHASE_LABEL: Record<Phase, string> = { starting: 'Preparing…', sending: 'Uploading', finishing: 'Checking the photo…', failed: 'Not added' };

function UploadingTile({ item, onRetry, onCancel }: { item: Item; onRetry: () => void; onCancel: () => void }) {
  const pct = Math.round(item.progress * 100);
  const failed = item.phase === 'failed';
  const [previewable, setPreviewable] = useState(true);
  return (
    <li className={`overflow-hidden rounded border bg-white ${failed ? 'border-rust-500' : 'border-chalk-200'}`}>
      {!failed && (
        <div className="relative aspect-square bg-chalk-100">
          {/* A local preview of the chosen file: it leaves the browser only through the upload. */}
          {previewable && <Image src={item.previewUrl} alt="" fill unoptimized className="object-cover opacity-60" onError={() => setPreviewable(false)} />}
        </div>
      )}
      <div className="space-y-1 p-2 text-xs">
        <p className="truncate font-semibold text-ink-700" title={item.file.name}>
          {item.file.name}
        </p>
        {!failed && (
          <>
            <div
              role="progressbar"
              aria-label={`Uploading ${item.file.name}`}
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={pct}
              className="h-2 overflow-hidden rounded-full bg-chalk-200"
            >
              <div className="h-full rounded-full bg-petrol-500 transition-[width] duration-150" style={{ width: `${pct}%` }} />
            </div>
            <p className="text-ink-500" aria-live="polite">
              {PHASE_LABEL[item.phase]}
              {item.phase === 'sending' ? ` ${pct}%` : ''}
            </p>
          </>
        )}
        {failed && (
          <p role="alert" className="font-semibold text-rust-700">
            {item.error}
          </p>
        )}
        <div className="flex gap-1">
          {failed && item.retryable && (
            <Button tone="secondary" className="px-2 py-1 text-xs" onClick={onRetry}>
              Retry
            </Button>
          )}
          <Button tone="quiet" className="px-2 py-1 text-xs" onClick={onCancel}>
            {failed ? 'Dismiss' : 'Cancel'}
          </Button>
        </div>
      </div>
    </li>
  );
}
