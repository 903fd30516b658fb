// Where the scale data lives: its own database (lacewright_scale) beside the demo one, on the start command's
// cluster at 127.0.0.1:54329. When nothing answers there, the cluster in .data/pg is made and started.
import path from 'node:path';
import pg from 'pg';
import { databaseUrl, initCluster, resolveClusterDir, startCluster } from '../postgres';

export const SCALE_DATABASE = process.env.SCALE_DATABASE ?? 'lacewright_scale';

async function answers(url: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2_000 });
  try {
    await client.connect();
    await client.query('select 1');
    return true;
  } catch {
    return false;
  } finally {
    await client.end().catch(() => undefined);
  }
}

export interface ScaleTarget {
  /** The scale database. */
  url: string;
  /** The maintenance database on the same server, for create and drop. */
  adminUrl: string;
  database: string;
}

/** The scale database's server, started when it is not running; SCALE_DATABASE_URL points elsewhere. */
export async function scaleTarget(): Promise<ScaleTarget> {
  if (process.env.SCALE_DATABASE_URL) {
    const url = new URL(process.env.SCALE_DATABASE_URL);
    const database = url.pathname.slice(1);
    url.pathname = '/postgres';
    return { url: process.env.SCALE_DATABASE_URL, adminUrl: url.toString(), database };
  }
  const port = Number(process.env.LACEWRIGHT_PG_PORT ?? 54329);
  const adminUrl = databaseUrl(port, 'postgres');
  if (!(await answers(adminUrl))) {
    const dir = resolveClusterDir(path.join(process.cwd(), '.data', 'pg'));
    initCluster({ dir, port });
    startCluster({ dir, port });
  }
  return { url: databaseUrl(port, SCALE_DATABASE), adminUrl, database: SCALE_DATABASE };
}

/** Drops and makes the database again, empty. */
export async function recreateDatabase(target: ScaleTarget): Promise<void> {
  const admin = new pg.Client({ connectionString: target.adminUrl });
  await admin.connect();
  try {
    const name = `"${target.database.replace(/"/g, '""')}"`;
    await admin.query(`drop database if exists ${name} with (force)`);
    await admin.query(`create database ${name}`);
  } finally {
    await admin.end();
  }
}

export async function databaseExists(target: ScaleTarget): Promise<boolean> {
  const admin = new pg.Client({ connectionString: target.adminUrl });
  await admin.connect();
  try {
    const { rows } = await admin.query('select 1 from pg_database where datname = $1', [target.database]);
    return rows.length > 0;
  } finally {
    await admin.end();
  }
}
