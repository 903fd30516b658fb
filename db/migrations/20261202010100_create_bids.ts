import type { Knex } from 'knex';

// A shop's priced offer on a request. Money in integer cents, the total derived by the database.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bids', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('request_id').notNullable().references('wheel_requests.id').onDelete('CASCADE');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('CASCADE');
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.text('status').notNullable().defaultTo('live');
    t.integer('parts_cents').notNullable();
    t.integer('labour_cents').notNullable();
    t.integer('finish_cents').notNullable();
    t.integer('shipping_cents').notNullable();
    t.integer('lead_time_days').notNullable();
    t.timestamp('valid_until', { useTz: true }).notNullable();
    t.text('message').notNullable().defaultTo('');
    t.jsonb('proposed_change');
    t.integer('revision').notNullable().defaultTo(1);
    t.timestamp('closed_at', { useTz: true });
    t.timestamps(true, true, false);
    t.index(['request_id']);
    t.index(['shop_id', 'created_at']);
  });
  await knex.raw(`alter table bids add column total_cents integer generated always as (parts_cents + labour_cents + finish_cents + shipping_cents) stored`);
  await knex.raw(`alter table bids add constraint bids_status_check check (status in ('live','accepted','declined','withdrawn','expired'))`);
  await knex.raw(`alter table bids add constraint bids_money_check check (parts_cents >= 0 and labour_cents >= 0 and finish_cents >= 0 and shipping_cents >= 0)`);
  await knex.raw(`alter table bids add constraint bids_lead_time_check check (lead_time_days between 1 and 365)`);
  // One live bid per shop per request; the domain checks first so the usual answer is a plain 409.
  await knex.raw(`create unique index bids_one_live_per_shop on bids (request_id, shop_id) where status = 'live'`);
  await knex.raw(`create index bids_live_valid_until on bids (valid_until) where status = 'live'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('bids');
}
