import type { Knex } from 'knex';

// The work that follows an accepted bid. Later statuses (paid, building, shipped, completed…)
// belong to the payments and fulfilment code, so no status list is fixed here.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jobs', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('request_id').notNullable().unique().references('wheel_requests.id').onDelete('CASCADE');
    t.uuid('bid_id').notNullable().unique().references('bids.id').onDelete('CASCADE');
    t.uuid('rider_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('CASCADE');
    t.integer('price_cents').notNullable();
    t.text('status').notNullable().defaultTo('awaiting_payment');
    t.timestamps(true, true, false);
    t.index(['shop_id', 'status']);
    t.index(['rider_id']);
  });
  await knex.raw(`alter table jobs add constraint jobs_price_check check (price_cents >= 0)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('jobs');
}
