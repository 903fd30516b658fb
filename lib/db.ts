import 'server-only';
import knex, { type Knex } from 'knex';
import { knexConfig } from '@/knexfile';
import { env } from '@/lib/env';

// The one Knex instance, kept across hot reloads in development.
const globalForDb = globalThis as unknown as { lacewrightDb?: Knex };

export const db: Knex = globalForDb.lacewrightDb ?? knex(knexConfig(env.DATABASE_URL));
if (env.NODE_ENV !== 'production') globalForDb.lacewrightDb = db;
