import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { GET } from '@/app/api/tiles/[z]/[x]/[y]/route';

const call = (z: string, x: string, y: string, headers: HeadersInit = {}) =>
  GET(new Request(`http://localhost/api/tiles/${z}/${x}/${y}`, { headers }), { params: Promise.resolve({ z, x, y }) });

describe('GET /api/tiles/{z}/{x}/{y}.png', () => {
  it(
    'returns a cacheable PNG with an ETag, and 304 when the client has it',
    async () => {
      const res = await call('5', '7', '12.png');
      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('image/png');
      expect(res.headers.get('cache-control')).toBe('public, max-age=86400, immutable');
      const etag = res.headers.get('etag');
      expect(etag).toMatch(/^".+"$/);
      const meta = await sharp(Buffer.from(await res.arrayBuffer())).metadata();
      expect(meta).toMatchObject({ format: 'png', width: 256, height: 256 });

      const again = await call('5', '7', '12.png', { 'If-None-Match': etag! });
      expect(again.status).toBe(304);
      expect(again.headers.get('etag')).toBe(etag);
    },
    30_000,
  );

  it('answers 400 with a JSON error for a bad address', async () => {
    for (const [z, x, y] of [
      ['5', '7', 'twelve.png'],
      ['2', '0', '0.png'],
      ['5', '99', '12.png'],
    ]) {
      const res = await call(z, x, y);
      expect(res.status).toBe(400);
      expect(await res.json()).toEqual({ error: expect.any(String) });
    }
  });
});
