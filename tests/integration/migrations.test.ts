import knex from 'knex';
import { describe, expect, inject, it } from 'vitest';
import { knexConfig } from '../../knexfile';
import { databaseUrl, ensureDatabase } from '../../scripts/lib/postgres';
import { ensureTypeScriptImports } from '../../scripts/lib/database';

describe('migrations', () => {
  it('run up, all the way down, and up again on an empty database', async () => {
    ensureTypeScriptImports();
    const port = inject('clusterPort');
    ensureDatabase({ dir: inject('clusterDir'), port }, 'migration_roundtrip');
    const db = knex(knexConfig(databaseUrl(port, 'migration_roundtrip')));
    try {
      const [, firstUp] = await db.migrate.latest();
      expect(firstUp.length).toBeGreaterThan(0);
      await db.migrate.rollback(undefined, true);
      const tables = await db('pg_tables').where({ schemaname: 'public' }).whereNotIn('tablename', ['knex_migrations', 'knex_migrations_lock']).pluck('tablename');
      expect(tables).toEqual([]);
      const [, secondUp] = await db.migrate.latest();
      expect(secondUp).toEqual(firstUp);
    } finally {
      await db.destroy();
    }
  });
});
