import type { Knex } from 'knex';

// Processor events already handled, by event id: a repeat delivery finds its id here and changes nothing.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('webhook_events', (t) => {
    t.text('id').primary();
    t.text('type').notNullable();
    t.text('object_id');
    t.text('outcome').notNullable();
    t.timestamp('event_created_at', { useTz: true }).notNullable();
    t.timestamp('processed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('webhook_events');
}
