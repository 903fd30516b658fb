import type { Knex } from 'knex';

// One shop's bids on one request, newest first: the board's "your bid" column, the request page for a
// builder, the "has this shop taken part" check and the live-bid check before a bid, each one index probe.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create index bids_request_shop_created on bids (request_id, shop_id, created_at desc)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists bids_request_shop_created');
}
