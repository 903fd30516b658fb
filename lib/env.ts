import { z } from 'zod';
import { LOCAL_PAYMENTS } from './payments/localDefaults';

// Every setting the app reads, parsed once. Defaults fit the local setup the start command makes.
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().url().default('postgres://app@127.0.0.1:54329/lacewright'),
  APP_URL: z.string().url().default('http://127.0.0.1:3000'),
  AUTH_SECRET: z.string().min(16).default('lacewright-local-development-secret'),
  DEMO_MODE: z.enum(['0', '1']).default('1'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  MAIL_FROM: z.string().default('Lacewright <no-reply@lacewright.test>'),
  MAIL_CATCHER_URL: z.string().url().default('http://127.0.0.1:2526'),
  // Photo storage: any S3-compatible service; the defaults point at the local stand-in.
  S3_ENDPOINT: z.string().url().default('http://127.0.0.1:4569'),
  // The address browsers PUT presigned uploads to, when it differs from the one the server uses.
  S3_PUBLIC_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('lacewright-uploads'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  S3_MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(8 * 1024 * 1024),
  // Payments: the processor's API (the local stand-in by default), the webhook signing secret, the
  // platform's referral fee in basis points, and how many days after shipping receipt is confirmed for the rider.
  PAYMENTS_API_HOST: z.string().min(1).default(LOCAL_PAYMENTS.apiHost),
  PAYMENTS_API_PORT: z.coerce.number().int().positive().default(LOCAL_PAYMENTS.apiPort),
  PAYMENTS_API_PROTOCOL: z.enum(['http', 'https']).default('http'),
  PAYMENTS_SECRET_KEY: z.string().startsWith('sk_').default(LOCAL_PAYMENTS.secretKey),
  PAYMENTS_WEBHOOK_SECRET: z.string().startsWith('whsec_').default(LOCAL_PAYMENTS.webhookSecret),
  PAYMENTS_REFERRAL_FEE_BPS: z.coerce.number().int().min(0).max(5000).default(1000),
  PAYMENTS_AUTO_CONFIRM_DAYS: z.coerce.number().int().min(1).max(90).default(14),
});

export type Env = z.infer<typeof envSchema>;

function parseEnv(): Env {
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment settings:\n${lines}`);
  }
  return parsed.data;
}

export const env = parseEnv();
export const isDemo = env.DEMO_MODE === '1';
