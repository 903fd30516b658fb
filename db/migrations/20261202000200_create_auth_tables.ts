import type { Knex } from 'knex';

// What next-auth's e-mail sign-in needs: one-time tokens, and linked provider accounts.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('verification_tokens', (t) => {
    t.text('identifier').notNullable();
    t.text('token').notNullable(); // next-auth stores a hash, never the raw token
    t.timestamp('expires', { useTz: true }).notNullable();
    t.primary(['identifier', 'token']);
  });
  await knex.schema.createTable('auth_accounts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('type').notNullable();
    t.text('provider').notNullable();
    t.text('provider_account_id').notNullable();
    t.unique(['provider', 'provider_account_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('auth_accounts');
  await knex.schema.dropTable('verification_tokens');
}
