import type { Knex } from 'knex';
import path from 'node:path';

// One config for the app, the scripts and the tests; the URL is the only thing that changes.
export function knexConfig(connection = process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/lacewright'): Knex.Config {
  return {
    client: 'pg',
    connection,
    pool: { min: 0, max: Number(process.env.DB_POOL_MAX ?? 10) },
    migrations: { directory: path.join(process.cwd(), 'db/migrations'), extension: 'ts', loadExtensions: ['.ts'] },
    seeds: { directory: path.join(process.cwd(), 'db/seeds'), extension: 'ts', loadExtensions: ['.ts'] },
  };
}

const config: Record<string, Knex.Config> = {
  development: knexConfig(),
  production: knexConfig(),
  test: knexConfig(),
};

export default config;
