// The services around the app: used by the start command and by the browser tests, so both run the same thing.
import path from 'node:path';
import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import { startService, waitForHttp, type Service } from './processes';
import { LOCAL_PAYMENTS } from '../../lib/payments/localDefaults';

export interface StackPorts {
  app: number;
  smtp: number;
  mailApi: number;
  /** The S3 stand-in for photos; 4569 when not given. */
  s3?: number;
  /** The payments stand-in; 12111 when not given. */
  payments?: number;
}

export interface StackOptions {
  databaseUrl: string;
  ports: StackPorts;
  appUrl: string;
  authSecret: string;
  dataDir: string;
  quiet?: boolean;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const bin = (name: string) => path.join(root, 'node_modules/.bin', name);

const s3Port = (o: StackOptions) => o.ports.s3 ?? 4569;
const paymentsPort = (o: StackOptions) => o.ports.payments ?? LOCAL_PAYMENTS.apiPort;

export function stackEnv(o: StackOptions): NodeJS.ProcessEnv {
  return {
    ...process.env,
    NODE_ENV: 'production',
    DATABASE_URL: o.databaseUrl,
    APP_URL: o.appUrl,
    NEXTAUTH_URL: o.appUrl,
    AUTH_SECRET: o.authSecret,
    DEMO_MODE: '1',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(o.ports.smtp),
    MAIL_CATCHER_URL: `http://127.0.0.1:${o.ports.mailApi}`,
    MAIL_CATCHER_API_PORT: String(o.ports.mailApi),
    MAIL_CATCHER_DATA: path.join(o.dataDir, 'mail.jsonl'),
    S3_ENDPOINT: `http://127.0.0.1:${s3Port(o)}`,
    S3_FAKE_PORT: String(s3Port(o)),
    S3_FAKE_DATA: path.join(o.dataDir, 's3'),
    // Payments: the app and worker call the stand-in, which keeps its state in the data folder and
    // sends its signed events to the app's webhook route.
    PAYMENTS_API_HOST: '127.0.0.1',
    PAYMENTS_API_PORT: String(paymentsPort(o)),
    PAYMENTS_SECRET_KEY: process.env.PAYMENTS_SECRET_KEY ?? LOCAL_PAYMENTS.secretKey,
    PAYMENTS_WEBHOOK_SECRET: process.env.PAYMENTS_WEBHOOK_SECRET ?? LOCAL_PAYMENTS.webhookSecret,
    PAYMENTS_FAKE_PORT: String(paymentsPort(o)),
    PAYMENTS_FAKE_DATA: path.join(o.dataDir, 'payments-fake.json'),
    PAYMENTS_FAKE_SECRET_KEY: process.env.PAYMENTS_SECRET_KEY ?? LOCAL_PAYMENTS.secretKey,
    PAYMENTS_WEBHOOK_URL: `${o.appUrl}/api/payments/webhook`,
    PAYMENTS_FAKE_QUIET: process.env.LACEWRIGHT_DEBUG ? '' : '1',
  };
}

/** Starts the local fakes, then the production server; resolves once each answers. */
export async function startStack(o: StackOptions): Promise<Service[]> {
  fs.mkdirSync(o.dataDir, { recursive: true });
  const env = stackEnv(o);
  const services: Service[] = [];
  services.push(startService('mail', bin('tsx'), [path.join(root, 'scripts/mail-catcher.ts')], env, { quiet: o.quiet }));
  await waitForHttp(`http://127.0.0.1:${o.ports.mailApi}/health`, 20_000);
  // The photo store (bucket and CORS made at start); the app streams photos from it and browsers PUT to it.
  services.push(startService('s3', bin('tsx'), [path.join(root, 'scripts/s3-fake.ts')], env, { quiet: o.quiet }));
  await waitForHttp(`http://127.0.0.1:${s3Port(o)}/__fake/health`, 20_000);
  // The payments stand-in: its events wait and retry until the app below is up.
  services.push(startService('payments', bin('tsx'), [path.join(root, 'scripts/payments-fake.ts')], env, { quiet: o.quiet }));
  await waitForHttp(`http://127.0.0.1:${paymentsPort(o)}/health`, 20_000);
  services.push(startService('app', bin('next'), ['start', '-p', String(o.ports.app)], { ...env, PORT: String(o.ports.app) }, { quiet: o.quiet }));
  services.push(startService('worker', bin('tsx'), ['--conditions=react-server', path.join(root, 'scripts/worker.ts')], { ...env, WORKER_INTERVAL_MS: process.env.WORKER_INTERVAL_MS ?? '2000' }, { quiet: o.quiet }));
  await waitForHttp(`http://127.0.0.1:${o.ports.app}/api/health`, 60_000);
  return services;
}
