import type { Knex } from 'knex';

// The builders' board reads only open requests: partial indexes for each sort (with id for keyset
// paging), the latitude range of the distance prefilter, the spec arrays, and the worker's expiry scan.
const INDEXES = [
  `create index wheel_requests_open_published on wheel_requests (published_at desc, id desc) where status = 'open'`,
  `create index wheel_requests_open_needed_by on wheel_requests (needed_by, id) where status = 'open'`,
  `create index wheel_requests_open_budget on wheel_requests (budget_cents, id) where status = 'open'`,
  `create index wheel_requests_open_lat_lon on wheel_requests (latitude, longitude) where status = 'open'`,
  `create index wheel_requests_open_diameters on wheel_requests using gin (diameters_in) where status = 'open'`,
  `create index wheel_requests_open_rim_widths on wheel_requests using gin (rim_widths_in) where status = 'open'`,
  `create index wheel_requests_open_gauges on wheel_requests using gin (spoke_gauges) where status = 'open'`,
  `create index wheel_requests_open_spoke_counts on wheel_requests using gin (spoke_counts) where status = 'open'`,
  `create index wheel_requests_open_expires on wheel_requests (expires_at) where status = 'open'`,
];
const NAMES = INDEXES.map((sql) => sql.split(' ')[2]);

export async function up(knex: Knex): Promise<void> {
  for (const sql of INDEXES) await knex.raw(sql);
}

export async function down(knex: Knex): Promise<void> {
  for (const name of NAMES) await knex.raw(`drop index if exists ${name}`);
}
