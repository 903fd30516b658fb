import type { Knex } from 'knex';

// Closing a cancelled job's payment page is keyed per try: a stored failure must not be replayed to every retry.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('payments', (t) => {
    t.integer('close_attempts').notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('payments', (t) => {
    t.dropColumn('close_attempts');
  });
}
