import type { Knex } from 'knex';

// A rider's wheel request. The full wheel and frame spec stays in `spec`; the columns beside it are
// copies the board filters and sorts on, kept in step by lib/market on every write.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('wheel_requests', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('rider_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('title').notNullable();
    t.text('status').notNullable().defaultTo('draft');
    t.jsonb('spec').notNullable();
    t.specificType('diameters_in', 'numeric[]').notNullable();
    t.specificType('rim_widths_in', 'numeric[]').notNullable(); // rim width classes (2, 2.5, 3, 4, 5 inch)
    t.specificType('spoke_gauges', 'integer[]').notNullable();
    t.specificType('spoke_counts', 'integer[]').notNullable();
    t.text('zip').notNullable();
    t.text('city').notNullable();
    t.text('region').notNullable();
    t.double('latitude').notNullable();
    t.double('longitude').notNullable();
    t.text('delivery').notNullable();
    t.date('needed_by').notNullable();
    t.integer('budget_cents').notNullable();
    t.text('notes').notNullable().defaultTo('');
    t.text('fit_verdict').notNullable();
    t.integer('baseline_low_cents').notNullable();
    t.integer('baseline_cents').notNullable();
    t.integer('baseline_high_cents').notNullable();
    t.uuid('accepted_bid_id'); // foreign key added once bids exist
    t.timestamp('published_at', { useTz: true });
    t.timestamp('expires_at', { useTz: true });
    t.timestamp('expiry_warned_at', { useTz: true });
    t.timestamp('closed_at', { useTz: true });
    t.timestamps(true, true, false);
    t.index(['rider_id', 'created_at']);
  });
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_status_check check (status in ('draft','open','awarded','cancelled','expired'))`);
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_delivery_check check (delivery in ('ship','pickup'))`);
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_money_check check (budget_cents >= 0 and baseline_low_cents >= 0 and baseline_cents >= 0 and baseline_high_cents >= 0)`);
  await knex.raw(`alter table wheel_requests add constraint wheel_requests_open_dates_check check (status = 'draft' or (published_at is not null and expires_at is not null))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('wheel_requests');
}
