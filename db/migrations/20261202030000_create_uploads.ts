import type { Knex } from 'knex';

// Photos kept in object storage. `subject_id` points at a wheel request, a shop or a job depending on
// `purpose`, so it carries no foreign key; the storage code checks it on every write.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('uploads', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('owner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('purpose').notNullable();
    t.uuid('subject_id').notNullable();
    t.text('object_key').notNullable().unique(); // the incoming key until finalized, then the clean image
    t.text('thumb_key').unique();
    t.text('content_type').notNullable(); // declared at first, then the type found in the bytes
    t.integer('bytes').notNullable(); // declared at first, then the clean image's size
    t.integer('width');
    t.integer('height');
    t.text('status').notNullable().defaultTo('pending');
    t.text('rejection_reason');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['purpose', 'subject_id', 'status', 'created_at']);
    t.index(['owner_id', 'created_at']);
  });
  await knex.raw(`alter table uploads add constraint uploads_purpose_check check (purpose in ('request_photo','portfolio','shipment_photo'))`);
  await knex.raw(`alter table uploads add constraint uploads_status_check check (status in ('pending','ready','rejected'))`);
  await knex.raw(`alter table uploads add constraint uploads_bytes_check check (bytes >= 0)`);
  await knex.raw(`alter table uploads add constraint uploads_ready_check check (status <> 'ready' or (thumb_key is not null and width > 0 and height > 0))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('uploads');
}
