// Migrations and seeds, run from scripts and tests against any database URL.
import knex from 'knex';
import { register } from 'tsx/esm/api';
import { knexConfig } from '../../knexfile';

// Knex imports migration and seed files with Node's own import(); teach it TypeScript once per process.
let tsxRegistered = false;
function ensureTypeScriptImports() {
  if (!tsxRegistered) register();
  tsxRegistered = true;
}

export async function migrateLatest(url: string): Promise<string[]> {
  ensureTypeScriptImports();
  const db = knex(knexConfig(url));
  try {
    const [, applied] = await db.migrate.latest();
    return applied as string[];
  } finally {
    await db.destroy();
  }
}

export async function seedDemo(url: string): Promise<void> {
  ensureTypeScriptImports();
  const db = knex(knexConfig(url));
  try {
    await db.seed.run();
  } finally {
    await db.destroy();
  }
}

export { ensureTypeScriptImports };
