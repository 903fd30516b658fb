import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('wheel_requests', (t) => {
    t.foreign('accepted_bid_id', 'wheel_requests_accepted_bid_fk').references('bids.id');
  });
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_awarded_check check ((status = 'awarded') = (accepted_bid_id is not null))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table wheel_requests drop constraint wheel_requests_awarded_check');
  await knex.schema.alterTable('wheel_requests', (t) => {
    t.dropForeign('accepted_bid_id', 'wheel_requests_accepted_bid_fk');
  });
}
