import { z } from 'zod';

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
