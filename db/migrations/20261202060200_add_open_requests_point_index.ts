import type { Knex } from 'knex';

// The board's distance prefilter as a box on both axes at once (the latitude/longitude b-tree can only
// narrow by latitude band). The planner's estimate for a box is small, so a radius search starts from the
// rows near the shop rather than from every open request.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index wheel_requests_open_point on wheel_requests using gist (point(longitude, latitude)) where status = 'open'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists wheel_requests_open_point');
}
