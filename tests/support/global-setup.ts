// Integration tests: a throwaway Postgres cluster with the schema migrated; removed afterwards.
import type { TestProject } from 'vitest/node';
import { startThrowawayCluster } from '../../scripts/lib/postgres';
import { migrateLatest } from '../../scripts/lib/database';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    clusterDir: string;
    clusterPort: number;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startThrowawayCluster();
  const databaseUrl = cluster.url('lacewright_test');
  await migrateLatest(databaseUrl);
  project.provide('databaseUrl', databaseUrl);
  project.provide('clusterDir', cluster.dir);
  project.provide('clusterPort', cluster.port);
  return () => cluster.stop();
}
