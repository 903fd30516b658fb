import type { Knex } from 'knex';

// An invitation for a shop to bid on a request: sent by the matcher when the request is published, or by
// the rider from the shop's page. One per shop per request, so a shop never hears about a request twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('shop_invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('request_id').notNullable().references('wheel_requests.id').onDelete('CASCADE');
    t.uuid('shop_id').notNullable().references('shops.id').onDelete('CASCADE');
    t.text('source').notNullable();
    t.uuid('invited_by').references('users.id').onDelete('SET NULL');
    t.double('match_score');
    t.jsonb('reasons').notNullable().defaultTo('[]');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['request_id', 'shop_id'], { indexName: 'shop_invitations_once' });
    t.index(['shop_id', 'created_at']);
  });
  await knex.raw(`alter table shop_invitations add constraint shop_invitations_source_check check (source in ('match','rider'))`);
  await knex.raw(`alter table shop_invitations add constraint shop_invitations_score_check check (match_score is null or match_score between 0 and 1)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('shop_invitations');
}
