import type { Knex } from 'knex';

// One connected account per shop at the payments processor: where a builder's share is transferred.
// The row exists from the first setup attempt, so retries reuse one account and one key.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payout_accounts', (t) => {
    t.uuid('shop_id').primary().references('shops.id').onDelete('CASCADE');
    t.text('account_id').unique();
    t.text('status').notNullable().defaultTo('creating');
    t.integer('create_attempt').notNullable().defaultTo(1);
    t.integer('links_issued').notNullable().defaultTo(0);
    t.boolean('details_submitted').notNullable().defaultTo(false);
    t.boolean('transfers_active').notNullable().defaultTo(false);
    t.timestamp('synced_at', { useTz: true });
    t.timestamps(true, true, false);
  });
  await knex.raw(`alter table payout_accounts add constraint payout_accounts_status_check check (status in ('creating','onboarding','active'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('payout_accounts');
}
