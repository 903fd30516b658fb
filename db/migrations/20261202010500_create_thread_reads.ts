import type { Knex } from 'knex';

// How far each person has read each thread; messages after this are "new" to them.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('thread_reads', (t) => {
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('request_id').notNullable().references('wheel_requests.id').onDelete('CASCADE');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('CASCADE');
    t.timestamp('last_read_at', { useTz: true }).notNullable();
    t.primary(['user_id', 'request_id', 'shop_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('thread_reads');
}
