import type { Knex } from 'knex';

// One thread per request and shop: the pair (request_id, shop_id) names it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('messages', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('request_id').notNullable().references('wheel_requests.id').onDelete('CASCADE');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('CASCADE');
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.text('body').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['request_id', 'shop_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('messages');
}
