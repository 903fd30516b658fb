import type { Knex } from 'knex';

// A dispute freezes a job's money until an admin releases it, refunds it or splits it, with a written reason.
// Notes are the dispute's thread: what each side says, and the admin's questions. Photos come later.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('disputes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().unique().references('jobs.id').onDelete('RESTRICT');
    t.uuid('opened_by').references('users.id').onDelete('SET NULL');
    t.text('opened_by_role').notNullable();
    t.text('reason').notNullable();
    t.text('details').notNullable();
    t.text('job_status_before').notNullable();
    t.text('status').notNullable().defaultTo('open');
    t.text('resolution');
    t.integer('refund_cents');
    t.integer('release_cents');
    t.text('resolution_reason');
    t.uuid('resolved_by').references('users.id').onDelete('SET NULL');
    t.timestamp('resolved_at', { useTz: true });
    t.timestamps(true, true, false);
    t.index(['status', 'created_at']);
  });
  await knex.raw(`alter table disputes add constraint disputes_status_check check (status in ('open','resolved'))`);
  await knex.raw(`alter table disputes add constraint disputes_role_check check (opened_by_role in ('rider','builder'))`);
  await knex.raw(
    `alter table disputes add constraint disputes_reason_check check (reason in ('not_received','not_as_described','damaged','late','no_response','other'))`,
  );
  await knex.raw(
    `alter table disputes add constraint disputes_resolution_check check (
      (status = 'open' and resolution is null) or
      (status = 'resolved' and resolution in ('release','refund','split') and refund_cents >= 0 and release_cents >= 0 and resolution_reason is not null))`,
  );

  await knex.schema.createTable('dispute_notes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('dispute_id').notNullable().references('disputes.id').onDelete('CASCADE');
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.text('author_role').notNullable();
    t.text('body').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['dispute_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('dispute_notes');
  await knex.schema.dropTable('disputes');
}
