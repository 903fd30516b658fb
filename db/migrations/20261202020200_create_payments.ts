import type { Knex } from 'knex';

// Payment intents per job. Each attempt has its own idempotency key; a row is written before the call
// to the processor, so a lost answer is retried with the same key instead of charging twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('RESTRICT');
    t.integer('attempt').notNullable();
    t.text('idempotency_key').notNullable().unique();
    t.text('payment_intent_id').unique();
    t.text('charge_id').unique();
    t.integer('amount_cents').notNullable();
    t.text('currency').notNullable();
    t.text('status').notNullable().defaultTo('creating');
    t.text('hosted_url');
    t.text('last_error');
    t.timestamps(true, true, false);
    t.unique(['job_id', 'attempt']);
  });
  await knex.raw(`alter table payments add constraint payments_amount_check check (amount_cents > 0)`);
  await knex.raw(
    `alter table payments add constraint payments_status_check check (status in ('creating','failed','requires_payment_method','requires_action','processing','succeeded','canceled'))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('payments');
}
