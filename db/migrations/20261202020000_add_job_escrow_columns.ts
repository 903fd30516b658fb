import type { Knex } from 'knex';

// What a job needs to carry through escrow: the fee rate fixed when the rider pays, the charge that funded it,
// the moments it moved, how the wheel was handed over, and when the worker may confirm receipt on the rider's behalf.
const STATUSES = ['awaiting_payment', 'funded', 'building', 'shipped', 'completed', 'cancelled', 'refunded', 'disputed', 'resolved'];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('jobs', (t) => {
    t.text('currency').notNullable().defaultTo('usd');
    t.integer('fee_bps');
    t.integer('fee_cents');
    t.text('payment_intent_id');
    t.text('charge_id');
    t.timestamp('funded_at', { useTz: true });
    t.timestamp('build_started_at', { useTz: true });
    t.timestamp('shipped_at', { useTz: true });
    t.timestamp('auto_confirm_at', { useTz: true });
    t.timestamp('completed_at', { useTz: true });
    t.text('completed_by');
    t.timestamp('cancelled_at', { useTz: true });
    t.text('cancelled_by');
    t.text('cancel_reason');
    t.timestamp('disputed_at', { useTz: true });
    t.text('disputed_from');
    t.timestamp('resolved_at', { useTz: true });
    t.text('handover');
    t.text('carrier');
    t.text('tracking_number');
  });
  await knex.raw(`alter table jobs add constraint jobs_status_check check (status in (${STATUSES.map((s) => `'${s}'`).join(',')}))`);
  await knex.raw(`alter table jobs add constraint jobs_fee_bps_check check (fee_bps is null or fee_bps between 0 and 10000)`);
  await knex.raw(`alter table jobs add constraint jobs_fee_cents_check check (fee_cents is null or fee_cents between 0 and price_cents)`);
  await knex.raw(`alter table jobs add constraint jobs_handover_check check (handover is null or handover in ('carrier','pickup'))`);
  await knex.raw(`alter table jobs add constraint jobs_completed_by_check check (completed_by is null or completed_by in ('rider','auto'))`);
  await knex.raw(`alter table jobs add constraint jobs_cancelled_by_check check (cancelled_by is null or cancelled_by in ('rider','builder','system'))`);
  await knex.raw(`create index jobs_auto_confirm_due on jobs (auto_confirm_at) where status = 'shipped'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists jobs_auto_confirm_due');
  for (const c of ['status', 'fee_bps', 'fee_cents', 'handover', 'completed_by', 'cancelled_by']) {
    await knex.raw(`alter table jobs drop constraint jobs_${c}_check`);
  }
  await knex.schema.alterTable('jobs', (t) => {
    t.dropColumns(
      'currency',
      'fee_bps',
      'fee_cents',
      'payment_intent_id',
      'charge_id',
      'funded_at',
      'build_started_at',
      'shipped_at',
      'auto_confirm_at',
      'completed_at',
      'completed_by',
      'cancelled_at',
      'cancelled_by',
      'cancel_reason',
      'disputed_at',
      'disputed_from',
      'resolved_at',
      'handover',
      'carrier',
      'tracking_number',
    );
  });
}
