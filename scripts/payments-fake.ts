// Runs the local payments fake until interrupted.
//   PAYMENTS_FAKE_PORT (default 12111), PAYMENTS_FAKE_HOST (127.0.0.1), PAYMENTS_FAKE_DATA
//   (.data/payments-fake.json), PAYMENTS_WEBHOOK_URL, PAYMENTS_WEBHOOK_SECRET,
//   PAYMENTS_FAKE_PUBLIC_URL, PAYMENTS_FAKE_SECRET_KEY, PAYMENTS_FAKE_FUNDS_DELAY_SECONDS,
//   PAYMENTS_FAKE_QUIET=1 to stop the request log.
import path from 'node:path';
import { z } from 'zod';
import { startPaymentsFake } from '../lib/fakes/payments/server';

const Env = z
  .object({
    PAYMENTS_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(12111),
    PAYMENTS_FAKE_HOST: z.string().min(1).default('127.0.0.1'),
    PAYMENTS_FAKE_DATA: z.string().min(1).default('.data/payments-fake.json'),
    PAYMENTS_WEBHOOK_URL: z.url().optional(),
    PAYMENTS_WEBHOOK_SECRET: z.string().min(1).optional(),
    PAYMENTS_FAKE_PUBLIC_URL: z.url().optional(),
    PAYMENTS_FAKE_SECRET_KEY: z.string().min(1).optional(),
    PAYMENTS_FAKE_FUNDS_DELAY_SECONDS: z.coerce.number().int().min(0).default(0),
    PAYMENTS_FAKE_QUIET: z.string().optional(),
  })
  .refine((env) => !env.PAYMENTS_WEBHOOK_URL || env.PAYMENTS_WEBHOOK_SECRET, {
    message: 'PAYMENTS_WEBHOOK_SECRET is required when PAYMENTS_WEBHOOK_URL is set',
    path: ['PAYMENTS_WEBHOOK_SECRET'],
  });

// Empty variables count as unset, as a shell `VAR= cmd` usually means.
const raw = Object.fromEntries(Object.entries(process.env).filter(([, v]) => v !== ''));
const parsed = Env.safeParse(raw);
if (!parsed.success) {
  console.error('payments fake: bad environment');
  for (const problem of parsed.error.issues) console.error(`  ${problem.path.join('.')}: ${problem.message}`);
  process.exit(1);
}
const env = parsed.data;

const fake = await startPaymentsFake({
  port: env.PAYMENTS_FAKE_PORT,
  host: env.PAYMENTS_FAKE_HOST,
  dataFile: path.resolve(env.PAYMENTS_FAKE_DATA),
  webhookUrl: env.PAYMENTS_WEBHOOK_URL,
  webhookSecret: env.PAYMENTS_WEBHOOK_SECRET,
  publicBaseUrl: env.PAYMENTS_FAKE_PUBLIC_URL,
  secretKey: env.PAYMENTS_FAKE_SECRET_KEY,
  fundsAvailableAfterSeconds: env.PAYMENTS_FAKE_FUNDS_DELAY_SECONDS,
  log: env.PAYMENTS_FAKE_QUIET ? undefined : (line) => console.log(`[payments-fake] ${line}`),
});
console.log(`payments fake listening on ${fake.url} (data: ${path.resolve(env.PAYMENTS_FAKE_DATA)})`);
if (env.PAYMENTS_WEBHOOK_URL) console.log(`payments fake: sending events to ${env.PAYMENTS_WEBHOOK_URL}`);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    void fake.close().then(() => process.exit(0));
  });
}
