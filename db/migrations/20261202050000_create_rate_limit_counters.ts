import type { Knex } from 'knex';

// Request counters per key and fixed time window, shared by every app server (sign-in, sign-up, public API).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limit_counters', (t) => {
    t.text('key').notNullable(); // e.g. "sign-in-failure:email:someone@example.com"
    t.timestamp('window_start', { useTz: true }).notNullable();
    t.integer('hits').notNullable().defaultTo(0);
    t.timestamp('expires_at', { useTz: true }).notNullable(); // the window's end; old rows are swept by it
    t.primary(['key', 'window_start']);
  });
  await knex.raw('create index rate_limit_counters_expires on rate_limit_counters (expires_at)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limit_counters');
}
