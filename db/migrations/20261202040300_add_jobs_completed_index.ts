import type { Knex } from 'knex';

// Review reminders and the review period look up jobs by when they completed.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index jobs_completed_at on jobs (completed_at) where status = 'completed'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists jobs_completed_at');
}
