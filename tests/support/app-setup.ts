// Browser and HTTP tests: a throwaway Postgres with demo data, the local fakes, and the production build,
// all on free loopback ports. Requires a build in NEXT_DIST_DIR (the test command makes one).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { freePort, startThrowawayCluster } from '../../scripts/lib/postgres';
import { migrateLatest, seedDemo } from '../../scripts/lib/database';
import { startStack } from '../../scripts/lib/stack';
import { stopAll } from '../../scripts/lib/processes';

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string;
    mailApiUrl: string;
    appDatabaseUrl: string;
    appClusterDir: string;
    appClusterPort: number;
    /** The payments stand-in the app talks to (test controls under /_test). */
    paymentsFakeUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startThrowawayCluster();
  const databaseUrl = cluster.url('lacewright_app');
  await migrateLatest(databaseUrl);
  await seedDemo(databaseUrl);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lacewright-stack-'));
  const ports = { app: await freePort(), smtp: await freePort(), mailApi: await freePort(), s3: await freePort(), payments: await freePort() };
  const appUrl = `http://127.0.0.1:${ports.app}`;
  try {
    await startStack({ databaseUrl, appUrl, authSecret: 'test-secret-for-the-browser-suite', dataDir, ports, quiet: true });
  } catch (err) {
    await stopAll();
    cluster.stop();
    throw err;
  }
  project.provide('appUrl', appUrl);
  project.provide('mailApiUrl', `http://127.0.0.1:${ports.mailApi}`);
  project.provide('appDatabaseUrl', databaseUrl);
  project.provide('appClusterDir', cluster.dir);
  project.provide('appClusterPort', cluster.port);
  project.provide('paymentsFakeUrl', `http://127.0.0.1:${ports.payments}`);
  return async () => {
    await stopAll();
    cluster.stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
}
