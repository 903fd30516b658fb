import type { Knex } from 'knex';

// Two-way reviews of a completed job: the rider reviews the shop (author_side 'rider') and the shop reviews
// the rider (author_side 'shop'). One per side per job. `hidden_until` keeps a review from the other side
// until both have written or the review period ends; `editable_until` closes the author's edit window.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('reviews', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
    t.text('author_side').notNullable();
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.uuid('subject_shop_id').references('shops.id').onDelete('CASCADE');
    t.uuid('subject_rider_id').references('users.id').onDelete('CASCADE');
    t.smallint('overall').notNullable();
    // Aspects of a shop, rated by its rider.
    t.smallint('build_quality');
    t.smallint('communication').notNullable();
    t.smallint('on_time');
    // Aspects of a rider, rated by the shop.
    t.smallint('clear_spec');
    t.smallint('payment');
    t.text('body').notNullable().defaultTo('');
    t.timestamp('editable_until', { useTz: true }).notNullable();
    t.timestamp('hidden_until', { useTz: true }).notNullable();
    t.timestamps(true, true, false);
    t.unique(['job_id', 'author_side'], { indexName: 'reviews_one_per_side' });
    t.index(['subject_rider_id', 'hidden_until']);
  });
  await knex.raw(`alter table reviews add constraint reviews_author_side_check check (author_side in ('rider','shop'))`);
  await knex.raw(`alter table reviews add constraint reviews_subject_check check (
    (author_side = 'rider' and subject_shop_id is not null and subject_rider_id is null) or
    (author_side = 'shop' and subject_rider_id is not null and subject_shop_id is null))`);
  await knex.raw(`alter table reviews add constraint reviews_stars_check check (
    overall between 1 and 5 and communication between 1 and 5 and
    coalesce(build_quality, 1) between 1 and 5 and coalesce(on_time, 1) between 1 and 5 and
    coalesce(clear_spec, 1) between 1 and 5 and coalesce(payment, 1) between 1 and 5)`);
  await knex.raw(`alter table reviews add constraint reviews_aspects_check check (
    (author_side = 'rider' and build_quality is not null and on_time is not null and clear_spec is null and payment is null) or
    (author_side = 'shop' and clear_spec is not null and payment is not null and build_quality is null and on_time is null))`);
  await knex.raw(`alter table reviews add constraint reviews_body_length_check check (char_length(body) <= 2000)`);
  // The shop page and the ranking read a shop's reviews that are open to view.
  await knex.raw(`create index reviews_shop_visible on reviews (subject_shop_id, hidden_until) where author_side = 'rider'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('reviews');
}
