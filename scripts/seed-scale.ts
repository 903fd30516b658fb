// The scale data set in its own database: 500 shops, 20,000 riders, 50,000 requests (10,000 open),
// 250,000 bids, 100,000 messages and 20,000 reviews, the same on every run (fixed seed, dates counted from
// the start of the UTC day). The database is dropped and made again, migrated, filled in bulk and analysed.
//   npm run seed:scale                 (lacewright_scale on 127.0.0.1:54329)
//   SCALE_DATABASE_URL=postgres://… npm run seed:scale
import pg from 'pg';
import { migrateLatest } from './lib/database';
import { FULL_SCALE, SCALE_PASSWORD, generateScaleData, scaleBuilderEmail, scaleRiderEmail, type ScaleCounts } from './lib/scale/generate';
import { bulkInsert } from './lib/scale/insert';
import { recreateDatabase, scaleTarget } from './lib/scale/target';

function countsFromArgs(): ScaleCounts {
  // --fraction=0.1 makes a smaller set of the same shape, for a quick try.
  const arg = process.argv.find((a) => a.startsWith('--fraction='));
  const fraction = arg ? Number(arg.split('=')[1]) : 1;
  if (!(fraction > 0 && fraction <= 1)) throw new Error('--fraction must be in (0, 1]');
  return Object.fromEntries(Object.entries(FULL_SCALE).map(([k, v]) => [k, Math.max(1, Math.round(v * fraction))])) as unknown as ScaleCounts;
}

async function main() {
  const started = Date.now();
  let last = started;
  const step = (text: string) => {
    const now = Date.now();
    console.log(`  ${text.padEnd(44)} ${((now - last) / 1000).toFixed(1).padStart(6)} s`);
    last = now;
  };

  const counts = countsFromArgs();
  const target = await scaleTarget();
  console.log(`Scale data into ${target.url}`);
  await recreateDatabase(target);
  step('database made');
  await migrateLatest(target.url);
  step('migrations applied');

  const data = generateScaleData(counts);
  step(`rows generated (${(data.users.length + data.shops.length + data.requests.length + data.bids.length + data.messages.length + data.reviews.length).toLocaleString('en-US')})`);

  const client = new pg.Client({ connectionString: target.url });
  await client.connect();
  try {
    // Bulk load: no need to wait for each commit to reach the disk.
    await client.query('set synchronous_commit = off');
    const load = async (table: string, rows: Record<string, unknown>[]) => {
      await bulkInsert(client, table, rows);
      step(`${table}: ${rows.length.toLocaleString('en-US')}`);
    };
    await load('users', data.users);
    await load('shops', data.shops);
    await load('shop_members', data.shopMembers);
    await load('wheel_requests', data.requests);
    await load('bids', data.bids);
    await client.query(
      `update wheel_requests r set status = 'awarded', accepted_bid_id = a.accepted_bid_id
         from json_populate_recordset(null::wheel_requests, $1::json) a where r.id = a.id`,
      [JSON.stringify(data.awards.map((a) => ({ id: a.request_id, accepted_bid_id: a.accepted_bid_id })))],
    );
    step(`awarded requests: ${data.awards.length.toLocaleString('en-US')}`);
    await load('jobs', data.jobs);
    await load('reviews', data.reviews);
    await load('messages', data.messages);
    await load('thread_reads', data.threadReads);
    await client.query('vacuum analyze');
    step('vacuum analyze');
    const { rows } = await client.query(
      `select (select count(*) from wheel_requests where status = 'open' and expires_at > now())::int as open,
              (select count(*) from wheel_requests)::int as requests, (select count(*) from bids)::int as bids,
              (select count(*) from bids where status = 'live')::int as live_bids, (select count(*) from jobs)::int as jobs,
              pg_size_pretty(pg_database_size(current_database())) as size`,
    );
    console.log(`\n  ${JSON.stringify(rows[0])}`);
  } finally {
    await client.end();
  }
  console.log(`\nDone in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  console.log(`Sign in with ${scaleBuilderEmail(0)} (a builder) or ${scaleRiderEmail(0)} (a rider), password ${SCALE_PASSWORD}.`);
}

main().catch((err) => {
  console.error('The scale seed failed:', err instanceof Error ? err.message : err);
  process.exit(1);
});
