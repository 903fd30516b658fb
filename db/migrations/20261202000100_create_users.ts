import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable().unique(); // stored lower-cased
    t.text('name').notNullable();
    t.text('password_hash'); // null for accounts that only use e-mailed links
    t.text('role').notNullable().defaultTo('rider');
    t.timestamp('email_verified_at', { useTz: true });
    t.timestamps(true, true, false);
  });
  await knex.raw(`alter table users add constraint users_role_check check (role in ('rider','builder','admin'))`);
  await knex.raw(`alter table users add constraint users_email_lower check (email = lower(email))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
