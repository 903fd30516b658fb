import type { Knex } from 'knex';

// The board's radius search reads every open request in the box around the shop before it sorts and
// keeps a page. With the filter and sort columns carried in the point index, it reads them there alone
// (an index-only scan), rather than visiting a table page per candidate; the full rows are read for the
// page it keeps. Replaces the plain point index.
const COVERED = 'id, latitude, longitude, expires_at, published_at, needed_by, budget_cents, diameters_in, rim_widths_in, spoke_gauges, spoke_counts';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index wheel_requests_open_point_covering on wheel_requests using gist (point(longitude, latitude)) include (${COVERED}) where status = 'open'`);
  await knex.raw('drop index if exists wheel_requests_open_point');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`create index if not exists wheel_requests_open_point on wheel_requests using gist (point(longitude, latitude)) where status = 'open'`);
  await knex.raw('drop index if exists wheel_requests_open_point_covering');
}
