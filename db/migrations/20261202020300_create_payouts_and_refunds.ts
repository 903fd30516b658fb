import type { Knex } from 'knex';

// Money leaving the platform for a job: at most one payout (transfer) to the builder per job, and refunds
// to the rider. Both are decided inside the job's transaction and sent afterwards, retried by the worker.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payouts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().unique().references('jobs.id').onDelete('RESTRICT');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('RESTRICT');
    t.integer('share_cents').notNullable();
    t.integer('fee_cents').notNullable();
    t.integer('amount_cents').notNullable();
    t.text('status').notNullable().defaultTo('pending');
    t.text('transfer_id').unique();
    t.integer('key_attempt').notNullable().defaultTo(1);
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('leased_until', { useTz: true });
    t.text('last_error');
    t.timestamp('paid_at', { useTz: true });
    t.timestamps(true, true, false);
  });
  await knex.raw(`alter table payouts add constraint payouts_amounts_check check (fee_cents >= 0 and amount_cents > 0 and share_cents = amount_cents + fee_cents)`);
  await knex.raw(`alter table payouts add constraint payouts_status_check check (status in ('pending','paid'))`);
  await knex.raw(`create index payouts_due on payouts (next_attempt_at) where status = 'pending'`);

  await knex.schema.createTable('refunds', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('RESTRICT');
    t.integer('seq').notNullable();
    t.text('payment_intent_id').notNullable();
    t.text('charge_id').notNullable();
    t.integer('amount_cents').notNullable();
    t.text('reason').notNullable();
    t.text('status').notNullable().defaultTo('pending');
    t.text('refund_id').unique();
    t.integer('key_attempt').notNullable().defaultTo(1);
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('leased_until', { useTz: true });
    t.text('last_error');
    t.timestamp('refunded_at', { useTz: true });
    t.timestamps(true, true, false);
    t.unique(['job_id', 'seq']);
  });
  await knex.raw(`alter table refunds add constraint refunds_amount_check check (amount_cents > 0)`);
  await knex.raw(`alter table refunds add constraint refunds_status_check check (status in ('pending','succeeded'))`);
  await knex.raw(`alter table refunds add constraint refunds_reason_check check (reason in ('cancelled','build_cancelled','dispute','late_payment'))`);
  await knex.raw(`create index refunds_due on refunds (next_attempt_at) where status = 'pending'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('refunds');
  await knex.schema.dropTable('payouts');
}
