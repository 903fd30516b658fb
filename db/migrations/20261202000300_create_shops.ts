import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('shops', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('name').notNullable();
    t.text('slug').notNullable().unique();
    t.text('bio').notNullable().defaultTo('');
    t.text('city').notNullable();
    t.text('region').notNullable(); // US state code
    t.text('zip');
    t.double('latitude').notNullable();
    t.double('longitude').notNullable();
    t.jsonb('capabilities').notNullable().defaultTo('{}');
    t.timestamps(true, true, false);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('shops');
}
