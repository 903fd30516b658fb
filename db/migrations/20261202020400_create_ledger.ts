import type { Knex } from 'knex';

// Double-entry ledger of every money event on a job. A transaction is a set of entries (debit positive,
// credit negative) that sum to zero; Postgres checks that at commit and keeps the ledger append-only.
// A transaction recording something at the processor carries its id, so the same event is never booked twice.
const ACCOUNTS = ['processor', 'rider_funds_held', 'builder_payable', 'refunds_payable', 'platform_fees'];
const KINDS = ['charge', 'release', 'refund_due', 'refund', 'transfer', 'reversal'];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('ledger_transactions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('RESTRICT');
    t.text('kind').notNullable();
    t.text('external_ref');
    t.text('memo').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['job_id', 'created_at']);
    t.index(['created_at']);
  });
  await knex.raw(`alter table ledger_transactions add constraint ledger_transactions_kind_check check (kind in (${KINDS.map((k) => `'${k}'`).join(',')}))`);
  await knex.raw(`create unique index ledger_transactions_once on ledger_transactions (kind, external_ref) where external_ref is not null`);

  await knex.schema.createTable('ledger_entries', (t) => {
    t.bigIncrements('id');
    t.uuid('transaction_id').notNullable().references('ledger_transactions.id').onDelete('RESTRICT');
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('RESTRICT');
    t.text('account').notNullable();
    t.bigInteger('amount_cents').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['transaction_id']);
    t.index(['job_id', 'account']);
  });
  await knex.raw(`alter table ledger_entries add constraint ledger_entries_account_check check (account in (${ACCOUNTS.map((a) => `'${a}'`).join(',')}))`);
  await knex.raw(`alter table ledger_entries add constraint ledger_entries_nonzero_check check (amount_cents <> 0)`);

  await knex.raw(`
    create function ledger_transaction_balances() returns trigger language plpgsql as $$
    declare total bigint;
    begin
      select coalesce(sum(amount_cents), 0) into total from ledger_entries where transaction_id = new.transaction_id;
      if total <> 0 then
        raise exception 'ledger transaction % does not balance (off by % cents)', new.transaction_id, total;
      end if;
      return null;
    end $$`);
  await knex.raw(`
    create constraint trigger ledger_entries_balance after insert on ledger_entries
    deferrable initially deferred for each row execute function ledger_transaction_balances()`);
  await knex.raw(`
    create function ledger_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'the ledger is append-only: % on % is not allowed', tg_op, tg_table_name;
    end $$`);
  await knex.raw(`create trigger ledger_entries_append_only before update or delete on ledger_entries for each row execute function ledger_append_only()`);
  await knex.raw(`create trigger ledger_transactions_append_only before update or delete on ledger_transactions for each row execute function ledger_append_only()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('ledger_entries');
  await knex.schema.dropTable('ledger_transactions');
  await knex.raw('drop function ledger_append_only()');
  await knex.raw('drop function ledger_transaction_balances()');
}
