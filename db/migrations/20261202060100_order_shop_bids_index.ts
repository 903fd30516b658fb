import type { Knex } from 'knex';

// "My bids" lists a shop's bids newest first with the id as tie-break and stops at a page: with the
// index in that exact order it reads the first page and stops, however many bids the shop has made.
// It replaces the (shop_id, created_at) index, which it covers.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create index bids_shop_newest on bids (shop_id, created_at desc, id desc)');
  await knex.raw('drop index if exists bids_shop_id_created_at_index');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('create index if not exists bids_shop_id_created_at_index on bids (shop_id, created_at)');
  await knex.raw('drop index if exists bids_shop_newest');
}
