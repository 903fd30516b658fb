import type { Knex } from 'knex';

// E-mail written in the same transaction as the change that causes it, sent later by the worker.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('kind').notNullable();
    t.text('to_email').notNullable();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    t.text('dedupe_key').unique(); // a notice that must go out at most once carries a key
    t.text('status').notNullable().defaultTo('pending');
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('last_error');
    t.timestamp('sent_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`alter table outbox add constraint outbox_status_check check (status in ('pending','sent','dead'))`);
  await knex.raw(`create index outbox_due on outbox (next_attempt_at) where status = 'pending'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox');
}
