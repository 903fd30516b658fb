import type { Knex } from 'knex';

// A draft can be cancelled without ever being published: only requests that were open need the dates.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table wheel_requests drop constraint wheel_requests_open_dates_check');
  await knex.raw(
    `alter table wheel_requests add constraint wheel_requests_open_dates_check check (status not in ('open','awarded','expired') or (published_at is not null and expires_at is not null))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table wheel_requests drop constraint wheel_requests_open_dates_check');
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_open_dates_check check (status = 'draft' or (published_at is not null and expires_at is not null))`);
}
