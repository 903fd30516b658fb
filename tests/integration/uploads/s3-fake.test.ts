import { GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_ORIGIN, startS3, type S3Harness } from './support';

let s3: S3Harness;
beforeAll(async () => {
  s3 = await startS3();
});
afterAll(() => s3.stop());

const presign = (key: string, expiresIn = 60) =>
  getSignedUrl(s3.storage.presigner, new PutObjectCommand({ Bucket: s3.fake.bucket, Key: key, ContentType: 'image/jpeg', ContentLength: 4 }), {
    expiresIn,
    signableHeaders: new Set(['content-type', 'content-length']),
  });
const put = (url: string, headers: Record<string, string> = { 'content-type': 'image/jpeg' }) => fetch(url, { method: 'PUT', headers, body: 'abcd' });

describe('the local S3 stand-in', () => {
  it('refuses a presigned URL once it has expired', async () => {
    const url = await presign('incoming/someone/late', 1);
    await new Promise((r) => setTimeout(r, 2100));
    const res = await put(url);
    expect(res.status).toBe(403);
    expect(await res.text()).toContain('<Code>AccessDenied</Code>');
  });

  it('refuses a tampered signature, a wrong secret and anonymous writes; reads need a signature too', async () => {
    const url = new URL(await presign('incoming/someone/a'));
    url.searchParams.set('X-Amz-Signature', '0'.repeat(64));
    expect((await put(url.toString())).status).toBe(403);

    const wrongSecret = new S3Client({ endpoint: s3.fake.url, region: 'us-east-1', forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'not-the-secret' } });
    await expect(wrongSecret.send(new PutObjectCommand({ Bucket: s3.fake.bucket, Key: 'x', Body: 'x' }))).rejects.toThrow(/signature/i);
    wrongSecret.destroy();

    expect((await put(`${s3.fake.url}/${s3.fake.bucket}/incoming/anyone/b`)).status).toBe(403);
    const ok = await presign('incoming/someone/c');
    expect((await put(ok)).status).toBe(200);
    expect((await fetch(`${s3.fake.url}/${s3.fake.bucket}/incoming/someone/c`)).status).toBe(403);
    const read = await s3.storage.client.send(new GetObjectCommand({ Bucket: s3.fake.bucket, Key: 'incoming/someone/c' }));
    expect(await read.Body!.transformToString()).toBe('abcd');
  });

  it('answers CORS preflights for the app’s origin only', async () => {
    const url = await presign('incoming/someone/d');
    const preflight = (origin: string) =>
      fetch(url, { method: 'OPTIONS', headers: { origin, 'access-control-request-method': 'PUT', 'access-control-request-headers': 'content-type' } });
    const allowed = await preflight(APP_ORIGIN);
    expect(allowed.status).toBe(200);
    expect(allowed.headers.get('access-control-allow-methods')).toContain('PUT');
    expect((await preflight('http://elsewhere.test')).status).toBe(403);
  });
});
