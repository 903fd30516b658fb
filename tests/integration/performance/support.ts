// A database of the performance tests' own, filled fast with the scale generator at a size where the
// planner prefers indexes, and a way to capture the SQL the domain functions really send.
import type { Knex } from 'knex';
import { inject } from 'vitest';
import { testDb } from '../../support/db';
import { migrateLatest } from '../../../scripts/lib/database';
import { databaseUrl, ensureDatabase } from '../../../scripts/lib/postgres';
import { generateScaleData, type ScaleCounts, type ScaleData } from '../../../scripts/lib/scale/generate';
import { bulkInsert } from '../../../scripts/lib/scale/insert';

/**
 * Big enough that index plans are cheaper than reading whole tables, small enough to load in seconds, and
 * shaped like the scale data (a shop has bid on a few per cent of all requests, as 500 shops would have).
 */
export const EXPLAIN_COUNTS: ScaleCounts = { shops: 250, riders: 1_000, requests: 6_000, openRequests: 2_000, bids: 24_000, messages: 6_000, reviews: 600 };

export async function filledDatabase(name: string, counts = EXPLAIN_COUNTS): Promise<{ db: Knex; data: ScaleData }> {
  const port = inject('clusterPort');
  const database = `performance_${name}_${Date.now().toString(36)}_${process.pid}`;
  ensureDatabase({ dir: inject('clusterDir'), port }, database);
  await migrateLatest(databaseUrl(port, database));
  const db = testDb(databaseUrl(port, database));
  const data = generateScaleData(counts);
  const conn = await db.client.acquireConnection();
  try {
    await bulkInsert(conn, 'users', data.users);
    await bulkInsert(conn, 'shops', data.shops);
    await bulkInsert(conn, 'shop_members', data.shopMembers);
    await bulkInsert(conn, 'wheel_requests', data.requests);
    await bulkInsert(conn, 'bids', data.bids);
    await conn.query(
      `update wheel_requests r set status = 'awarded', accepted_bid_id = a.accepted_bid_id
         from json_populate_recordset(null::wheel_requests, $1::json) a where r.id = a.id`,
      [JSON.stringify(data.awards.map((a) => ({ id: a.request_id, accepted_bid_id: a.accepted_bid_id })))],
    );
    await bulkInsert(conn, 'jobs', data.jobs);
    await bulkInsert(conn, 'reviews', data.reviews);
    await bulkInsert(conn, 'messages', data.messages);
    await bulkInsert(conn, 'thread_reads', data.threadReads);
    await conn.query('vacuum analyze');
  } finally {
    await db.client.releaseConnection(conn);
  }
  return { db, data };
}

export interface CapturedQuery {
  sql: string;
  bindings: unknown[];
}

/** Runs `fn` and returns what it sent to the database, in order. */
export async function captureQueries<T>(db: Knex, fn: () => Promise<T>): Promise<{ result: T; queries: CapturedQuery[] }> {
  const queries: CapturedQuery[] = [];
  const listener = (q: { sql: string; bindings?: unknown[] }) => queries.push({ sql: q.sql, bindings: q.bindings ?? [] });
  db.on('query', listener);
  try {
    const result = await fn();
    return { result, queries };
  } finally {
    db.removeListener('query', listener);
  }
}

export interface PlanNode {
  'Node Type': string;
  'Relation Name'?: string;
  'Index Name'?: string;
  Plans?: PlanNode[];
}

/** EXPLAIN (FORMAT JSON) of one captured statement, with the same bindings. */
export async function explain(db: Knex, q: CapturedQuery): Promise<PlanNode> {
  const conn = await db.client.acquireConnection();
  try {
    const { rows } = await conn.query(`explain (format json) ${q.sql}`, q.bindings);
    return (rows[0]['QUERY PLAN'] as { Plan: PlanNode }[])[0].Plan;
  } finally {
    await db.client.releaseConnection(conn);
  }
}

export function planNodes(node: PlanNode): PlanNode[] {
  return [node, ...(node.Plans ?? []).flatMap(planNodes)];
}

const INDEX_NODES = new Set(['Index Scan', 'Index Only Scan', 'Bitmap Index Scan']);

/** Indexes the plan reads, as "table.index" (bitmap index scans name no table: "?.index"). */
export function indexesUsed(node: PlanNode): string[] {
  return planNodes(node)
    .filter((n) => INDEX_NODES.has(n['Node Type']))
    .map((n) => `${n['Relation Name'] ?? '?'}.${n['Index Name']}`);
}

/** Indexes read without visiting the table. */
export function indexOnlyScans(node: PlanNode): string[] {
  return planNodes(node)
    .filter((n) => n['Node Type'] === 'Index Only Scan')
    .map((n) => n['Index Name'] ?? '?');
}

export function seqScans(node: PlanNode): string[] {
  return planNodes(node)
    .filter((n) => n['Node Type'] === 'Seq Scan')
    .map((n) => n['Relation Name'] ?? '?');
}
