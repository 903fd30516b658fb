import 'server-only';
import { DeleteObjectsCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { env } from '@/lib/env';

// The object store behind uploads: any S3-compatible service (a local stand-in in development and tests).

export interface StorageConfig {
  endpoint: string;
  /** Where browsers send presigned PUTs; defaults to `endpoint`. */
  publicEndpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  maxUploadBytes: number;
}

export interface Storage {
  bucket: string;
  maxUploadBytes: number;
  client: S3Client;
  presigner: S3Client;
}

function client(endpoint: string, c: StorageConfig): S3Client {
  return new S3Client({
    endpoint,
    region: c.region,
    forcePathStyle: true,
    credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
    // Checksums on every PUT would bind a presigned URL to an empty body; sign only what matters.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
}

export function createStorage(c: StorageConfig): Storage {
  const main = client(c.endpoint, c);
  return {
    bucket: c.bucket,
    maxUploadBytes: c.maxUploadBytes,
    client: main,
    presigner: c.publicEndpoint && c.publicEndpoint !== c.endpoint ? client(c.publicEndpoint, c) : main,
  };
}

const globalForStorage = globalThis as unknown as { lacewrightStorage?: Storage };

/** The one store the app uses, configured from the environment. */
export function defaultStorage(): Storage {
  globalForStorage.lacewrightStorage ??= createStorage({
    endpoint: env.S3_ENDPOINT,
    publicEndpoint: env.S3_PUBLIC_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    maxUploadBytes: env.S3_MAX_UPLOAD_BYTES,
  });
  return globalForStorage.lacewrightStorage;
}

/** A URL that lets its holder PUT one object, of exactly this type and length, for a short time. */
export function presignPut(s: Storage, key: string, contentType: string, bytes: number, expiresInSeconds: number): Promise<string> {
  const command = new PutObjectCommand({ Bucket: s.bucket, Key: key, ContentType: contentType, ContentLength: bytes });
  return getSignedUrl(s.presigner, command, { expiresIn: expiresInSeconds, signableHeaders: new Set(['content-type', 'content-length']) });
}

const isMissing = (err: unknown) =>
  err instanceof S3ServiceException && (err.name === 'NotFound' || err.name === 'NoSuchKey' || err.$metadata.httpStatusCode === 404);

/** The object's size, or null when nothing is stored under the key. */
export async function objectSize(s: Storage, key: string): Promise<number | null> {
  try {
    const head = await s.client.send(new HeadObjectCommand({ Bucket: s.bucket, Key: key }));
    return head.ContentLength ?? 0;
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

/** Reads a whole object, refusing to hold more than `maxBytes` in memory. */
export async function readObject(s: Storage, key: string, maxBytes: number): Promise<Buffer | 'too-large' | null> {
  let res;
  try {
    res = await s.client.send(new GetObjectCommand({ Bucket: s.bucket, Key: key }));
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
  const body = res.Body as AsyncIterable<Uint8Array> | undefined;
  if (!body) return Buffer.alloc(0);
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of body) {
    total += chunk.length;
    if (total > maxBytes) {
      (res.Body as { destroy?: () => void }).destroy?.();
      return 'too-large';
    }
    chunks.push(Buffer.from(chunk));
  }
  return Buffer.concat(chunks);
}

export async function writeObject(s: Storage, key: string, body: Buffer, contentType: string): Promise<void> {
  await s.client.send(new PutObjectCommand({ Bucket: s.bucket, Key: key, Body: body, ContentType: contentType }));
}

export async function deleteObjects(s: Storage, keys: (string | null | undefined)[]): Promise<void> {
  const objects = keys.filter((k): k is string => Boolean(k)).map((Key) => ({ Key }));
  if (!objects.length) return;
  await s.client.send(new DeleteObjectsCommand({ Bucket: s.bucket, Delete: { Objects: objects, Quiet: true } }));
}

/** The object as a web stream, for sending straight on to the browser. */
export async function streamObject(s: Storage, key: string): Promise<{ body: ReadableStream; bytes?: number; etag?: string } | null> {
  try {
    const res = await s.client.send(new GetObjectCommand({ Bucket: s.bucket, Key: key }));
    if (!res.Body) return null;
    return { body: res.Body.transformToWebStream(), bytes: res.ContentLength, etag: res.ETag };
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}
