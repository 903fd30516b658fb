// Runs the local S3-compatible store until interrupted (used by the start command and the browser tests).
//   S3_FAKE_PORT (4569), S3_FAKE_HOST (127.0.0.1), S3_FAKE_DATA (.data/s3), S3_BUCKET (lacewright-uploads),
//   S3_FAKE_ORIGINS (comma-separated browser origins; default: APP_URL and its loopback twin),
//   S3_FAKE_VERBOSE=1 to log every request (refused ones are always logged).
import path from 'node:path';
import { z } from 'zod';
import { originsFor, startS3Fake } from '../lib/fakes/s3/server';

const Env = z.object({
  S3_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(4569),
  S3_FAKE_HOST: z.string().min(1).default('127.0.0.1'),
  S3_FAKE_DATA: z.string().min(1).default('.data/s3'),
  S3_BUCKET: z.string().regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'use a valid bucket name').default('lacewright-uploads'),
  APP_URL: z.url().default('http://localhost:3000'),
  S3_FAKE_ORIGINS: z.string().optional(),
  S3_FAKE_VERBOSE: z.string().optional(),
});

// Empty variables count as unset.
const parsed = Env.safeParse(Object.fromEntries(Object.entries(process.env).filter(([, v]) => v !== '')));
if (!parsed.success) {
  console.error('S3 fake: bad environment');
  for (const problem of parsed.error.issues) console.error(`  ${problem.path.join('.')}: ${problem.message}`);
  process.exit(1);
}
const env = parsed.data;
const origins = env.S3_FAKE_ORIGINS ? env.S3_FAKE_ORIGINS.split(',').map((o) => o.trim()).filter(Boolean) : originsFor(env.APP_URL);
const directory = path.resolve(env.S3_FAKE_DATA);

const fake = await startS3Fake({
  host: env.S3_FAKE_HOST,
  port: env.S3_FAKE_PORT,
  directory,
  bucket: env.S3_BUCKET,
  allowedOrigins: origins,
  log: (line) => console.log(line),
  logRequests: Boolean(env.S3_FAKE_VERBOSE),
});
console.log(`S3 fake listening on ${fake.url}, bucket "${fake.bucket}" (data: ${directory}; browser origins: ${origins.join(', ')})`);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    void fake.close().then(() => process.exit(0));
  });
}
