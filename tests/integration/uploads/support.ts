// Uploads tests: a throwaway S3 stand-in per file, a storage bound to it, and people, requests and jobs
// made with plain inserts.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import sharp from 'sharp';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { createAccount } from '@/lib/auth/accounts';
import type { SessionUser } from '@/lib/auth/roles';
import { startS3Fake, type S3Fake } from '@/lib/fakes/s3/server';
import { createStorage, type Storage } from '@/lib/storage/s3';
import { uniqueEmail } from '../../support/db';

export const TEST_MAX_BYTES = 200 * 1024;
export const APP_ORIGIN = 'http://127.0.0.1:3999';

export interface S3Harness {
  fake: S3Fake;
  storage: Storage;
  /** Every key in the bucket under a prefix. */
  keys(prefix?: string): Promise<string[]>;
  stop(): Promise<void>;
}

export async function startS3(): Promise<S3Harness> {
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'lacewright-s3-test-'));
  const fake = await startS3Fake({ port: 0, directory, bucket: 'uploads-test', allowedOrigins: [APP_ORIGIN] });
  const storage = createStorage({ endpoint: fake.url, region: 'us-east-1', bucket: fake.bucket, ...fake.credentials, maxUploadBytes: TEST_MAX_BYTES });
  return {
    fake,
    storage,
    async keys(prefix = '') {
      const res = await storage.client.send(new ListObjectsV2Command({ Bucket: fake.bucket, Prefix: prefix }));
      return (res.Contents ?? []).map((o) => o.Key!).sort();
    },
    async stop() {
      storage.client.destroy();
      await fake.close();
      fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}

const PASSWORD = 'a long test password';

export function makeRider(db: Knex): Promise<SessionUser> {
  return createAccount(db, { role: 'rider', name: 'Photo Rider', email: uniqueEmail('rider'), password: PASSWORD });
}

let shopCounter = 0;
export function makeBuilder(db: Knex): Promise<SessionUser> {
  shopCounter += 1;
  return createAccount(db, { role: 'builder', name: 'Photo Builder', email: uniqueEmail('builder'), password: PASSWORD, shopName: `Spoke Loft ${shopCounter}`, zip: '87102' });
}

export async function makeAdmin(db: Knex): Promise<SessionUser> {
  const user = await makeRider(db);
  await db('users').where({ id: user.id }).update({ role: 'admin' });
  return { ...user, role: 'admin' };
}

/** A second builder in an existing shop. */
export async function addShopMember(db: Knex, shopId: string): Promise<SessionUser> {
  const user = await makeRider(db);
  await db('users').where({ id: user.id }).update({ role: 'builder' });
  await db('shop_members').insert({ shop_id: shopId, user_id: user.id, member_role: 'member' });
  return { ...user, role: 'builder', shopId };
}

export async function makeRequest(db: Knex, rider: SessionUser, status: 'draft' | 'open' | 'cancelled' = 'open'): Promise<string> {
  const dated = status === 'open' ? { published_at: new Date(), expires_at: new Date(Date.now() + 14 * 86_400_000) } : {};
  const [row] = await db('wheel_requests')
    .insert({
      rider_id: rider.id,
      title: '26-inch rear on a 4-inch rim',
      status,
      spec: JSON.stringify({ wheels: [], frame: {} }),
      diameters_in: [26],
      rim_widths_in: [4],
      spoke_gauges: [12],
      spoke_counts: [72],
      zip: '90802',
      city: 'Long Beach',
      region: 'CA',
      latitude: 33.77,
      longitude: -118.19,
      delivery: 'ship',
      needed_by: new Date(Date.now() + 60 * 86_400_000).toISOString().slice(0, 10),
      budget_cents: 60_000,
      fit_verdict: 'fits',
      baseline_low_cents: 40_000,
      baseline_cents: 50_000,
      baseline_high_cents: 60_000,
      ...dated,
    })
    .returning('id');
  return row.id;
}

/** An awarded request with a job for the builder's shop. */
export async function makeJob(db: Knex, rider: SessionUser, builder: SessionUser): Promise<string> {
  const requestId = await makeRequest(db, rider);
  const [bid] = await db('bids')
    .insert({ request_id: requestId, shop_id: builder.shopId, author_id: builder.id, status: 'accepted', parts_cents: 30_000, labour_cents: 15_000, finish_cents: 0, shipping_cents: 4_000, lead_time_days: 21, valid_until: new Date(Date.now() + 7 * 86_400_000) })
    .returning('id');
  await db('wheel_requests').where({ id: requestId }).update({ status: 'awarded', accepted_bid_id: bid.id });
  const [job] = await db('jobs').insert({ request_id: requestId, bid_id: bid.id, rider_id: rider.id, shop_id: builder.shopId, price_cents: 49_000 }).returning('id');
  return job.id;
}

/** A small photo-like JPEG: a gradient, so it compresses like a picture rather than a flat fill. */
export async function photoJpeg(width = 640, height = 480, opts: { exif?: Record<string, Record<string, string>>; orientation?: number } = {}): Promise<Buffer> {
  const raw = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      raw[i] = (x * 255) / width;
      raw[i + 1] = (y * 255) / height;
      raw[i + 2] = 90;
    }
  }
  let img = sharp(raw, { raw: { width, height, channels: 3 } }).jpeg({ quality: 80 });
  if (opts.exif) img = img.withExif(opts.exif);
  if (opts.orientation) img = img.withMetadata({ orientation: opts.orientation });
  return img.toBuffer();
}

/** EXIF with a GPS position and a camera make, as a phone writes. */
export const GPS_EXIF = {
  IFD0: { Make: 'Quillfeather', Model: 'QF-7 Pocket', Software: 'shutter 1.2' },
  IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '34/1 3/1 1/1', GPSLongitudeRef: 'W', GPSLongitude: '118/1 14/1 2/1' },
};

/** Does this EXIF block hold a GPS sub-directory (tag 0x8825, in either byte order)? */
export function hasGpsPointer(exif: Buffer | undefined): boolean {
  if (!exif) return false;
  return exif.includes(Buffer.from([0x88, 0x25])) || exif.includes(Buffer.from([0x25, 0x88]));
}

/** PUTs bytes to a presigned URL, as a browser would. */
export function putTo(url: string, body: Buffer, headers: Record<string, string>): Promise<Response> {
  return fetch(url, { method: 'PUT', headers: { ...headers, origin: APP_ORIGIN }, body: new Uint8Array(body) });
}
