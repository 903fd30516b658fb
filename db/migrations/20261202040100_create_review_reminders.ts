import type { Knex } from 'knex';

// One reminder to write a review per side per job, ever: the row is written with the reminder's e-mail.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('review_reminders', (t) => {
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
    t.text('side').notNullable();
    t.timestamp('sent_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['job_id', 'side']);
  });
  await knex.raw(`alter table review_reminders add constraint review_reminders_side_check check (side in ('rider','shop'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('review_reminders');
}
