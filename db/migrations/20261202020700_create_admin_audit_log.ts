import type { Knex } from 'knex';

// Every admin action that decides or reveals money matters, who took it and why. Append-only.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('admin_audit_log', (t) => {
    t.bigIncrements('id');
    t.uuid('admin_id').references('users.id').onDelete('SET NULL');
    t.text('admin_email').notNullable();
    t.text('action').notNullable();
    t.text('target_type').notNullable();
    t.text('target_id');
    t.text('reason');
    t.jsonb('details').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['created_at']);
    t.index(['target_type', 'target_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('admin_audit_log');
}
