import type { Knex } from 'knex';

// Shop settings beside the capabilities: what an hour of bench time costs and how many builds fit at once.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('shops', (t) => {
    t.integer('labour_rate_cents_per_hour');
    t.integer('builds_at_once').notNullable().defaultTo(1);
  });
  await knex.raw(`alter table shops add constraint shops_labour_rate_check check (labour_rate_cents_per_hour is null or labour_rate_cents_per_hour >= 0)`);
  await knex.raw(`alter table shops add constraint shops_builds_at_once_check check (builds_at_once between 1 and 100)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table shops drop constraint shops_builds_at_once_check');
  await knex.raw('alter table shops drop constraint shops_labour_rate_check');
  await knex.schema.alterTable('shops', (t) => {
    t.dropColumn('builds_at_once');
    t.dropColumn('labour_rate_cents_per_hour');
  });
}
