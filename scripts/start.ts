// The start command: a local Postgres cluster, migrations, demo data (once), a production build, the fakes and the app.
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { databaseUrl, ensureDatabase, initCluster, resolveClusterDir, startCluster, stopCluster } from './lib/postgres';
import { migrateLatest, seedDemo } from './lib/database';
import { signalAll, stopAll } from './lib/processes';
import { startStack } from './lib/stack';
import { DEMO_ACCOUNTS } from '../lib/demo';

const root = process.cwd();
const dataDir = path.join(root, '.data');
const pgPort = Number(process.env.LACEWRIGHT_PG_PORT ?? 54329);
const appPort = Number(process.env.PORT ?? 3000);
const appUrl = process.env.APP_URL ?? `http://localhost:${appPort}`;

function step(text: string) {
  console.log(`\n▸ ${text}`);
}

/** A session secret made once per checkout and kept in .data (never committed). */
function authSecret(): string {
  const file = path.join(dataDir, 'auth-secret');
  if (!fs.existsSync(file)) fs.writeFileSync(file, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

/** Builds when the sources changed since the last build (or there is none). */
function buildIfNeeded() {
  const stampFile = path.join(root, '.next', 'lacewright-build-stamp');
  const stamp = crypto
    .createHash('sha1')
    .update(execFileSync('git', ['rev-parse', 'HEAD'], { encoding: 'utf8' }).trim())
    .update(execFileSync('git', ['status', '--porcelain'], { encoding: 'utf8' }))
    .digest('hex');
  if (fs.existsSync(path.join(root, '.next', 'BUILD_ID')) && fs.existsSync(stampFile) && fs.readFileSync(stampFile, 'utf8') === stamp) {
    console.log('  the production build is current');
    return;
  }
  execFileSync(path.join(root, 'node_modules/.bin/next'), ['build'], { stdio: 'inherit', env: { ...process.env, NEXT_TELEMETRY_DISABLED: '1' } });
  fs.writeFileSync(stampFile, stamp);
}

let clusterDir: string | null = null;

async function main() {
  // Stop fast: whoever stops us may follow up with SIGKILL within seconds, and the services run in
  // their own process groups, so they are signalled here rather than left behind.
  let stopping = false;
  const shutdown = () => {
    if (stopping) return;
    stopping = true;
    console.log('\nStopping…');
    signalAll('SIGTERM');
    try {
      if (clusterDir) stopCluster(clusterDir);
    } catch (err) {
      console.error('PostgreSQL did not stop cleanly:', (err as Error).message);
    }
    setTimeout(() => {
      signalAll('SIGKILL');
      process.exit(0);
    }, 1_500).unref();
  };
  process.on('SIGINT', shutdown);
  process.on('SIGTERM', shutdown);
  process.on('SIGHUP', shutdown);
  fs.mkdirSync(dataDir, { recursive: true });
  step('PostgreSQL');
  clusterDir = resolveClusterDir(path.join(dataDir, 'pg'));
  initCluster({ dir: clusterDir, port: pgPort });
  startCluster({ dir: clusterDir, port: pgPort });
  ensureDatabase({ dir: clusterDir, port: pgPort }, 'lacewright');
  const dbUrl = databaseUrl(pgPort, 'lacewright');
  console.log(`  ${dbUrl} (cluster in ${clusterDir})`);

  step('Migrations');
  const applied = await migrateLatest(dbUrl);
  console.log(applied.length ? `  applied ${applied.length}` : '  up to date');

  step('Demo data');
  await seedDemo(dbUrl);
  console.log('  in place (invented shops and people)');

  step('Production build');
  buildIfNeeded();

  step('Local services and the app');
  await startStack({
    databaseUrl: dbUrl,
    appUrl,
    authSecret: authSecret(),
    dataDir,
    ports: { app: appPort, smtp: Number(process.env.SMTP_PORT ?? 2525), mailApi: Number(process.env.MAIL_CATCHER_API_PORT ?? 2526) },
  });

  const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.label.length));
  console.log(`\n Lacewright is running at ${appUrl}\n`);
  console.log(' Demo sign-ins (invented accounts):');
  for (const a of DEMO_ACCOUNTS) console.log(`   ${a.label.padEnd(width)}  ${a.email}  /  ${a.password}`);
  console.log(`\n E-mailed sign-in links land in the demo mailbox: ${appUrl}/admin/mailbox (as the admin).`);
  console.log(' Press Ctrl+C to stop everything.\n');

}

main().catch(async (err) => {
  console.error('\nThe start command failed:', err instanceof Error ? err.message : err);
  await stopAll();
  process.exit(1);
});
