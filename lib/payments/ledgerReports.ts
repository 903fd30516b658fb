// Ledger reports for admins: each job's books, totals by month (UTC), and every entry as CSV.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden } from '@/lib/errors';
import { writeAudit } from './audit';
import { JOB_STATUS_LABELS, type JobRow, type JobStatus } from './jobStates';
import { ledgerProblems } from './ledger';

export interface JobLedgerLine {
  jobId: string;
  title: string;
  shopName: string;
  status: JobStatus;
  statusLabel: string;
  priceCents: number;
  chargedCents: number;
  feesCents: number;
  transferredCents: number;
  refundedCents: number;
  stillHeldCents: number;
  balanced: boolean;
  problems: string[];
}

const money = (kind: string, account: string, sign = 1) =>
  `coalesce(sum(case when t.kind = '${kind}' and e.account = '${account}' then ${sign} * e.amount_cents end), 0)::bigint`;

/** Per job: charged, fees, transferred, refunded, still held, and whether the books balance. */
export async function ledgerByJob(db: Knex, opts: { limit?: number } = {}): Promise<JobLedgerLine[]> {
  const rows = (await db('jobs as j')
    .join('wheel_requests as r', 'r.id', 'j.request_id')
    .join('shops as s', 's.id', 'j.shop_id')
    .leftJoin('ledger_entries as e', 'e.job_id', 'j.id')
    .leftJoin('ledger_transactions as t', 't.id', 'e.transaction_id')
    .groupBy('j.id', 'r.title', 's.name')
    .orderBy('j.created_at', 'desc')
    .limit(Math.min(opts.limit ?? 200, 1000))
    .select(
      'j.*',
      'r.title',
      's.name as shop_name',
      db.raw(`${money('charge', 'processor')} as charged`),
      db.raw(`${money('refund', 'processor', -1)} as refunded`),
      db.raw(`(${money('transfer', 'processor', -1)} - ${money('reversal', 'processor')}) as transferred`),
      db.raw(`coalesce(sum(case when e.account = 'platform_fees' then -e.amount_cents end), 0)::bigint as fees`),
      db.raw(`coalesce(sum(case when e.account in ('rider_funds_held','builder_payable','refunds_payable') then -e.amount_cents end), 0)::bigint as held`),
    )) as (JobRow & { title: string; shop_name: string; charged: string; refunded: string; transferred: string; fees: string; held: string })[];
  const out: JobLedgerLine[] = [];
  for (const r of rows) {
    const problems = await ledgerProblems(db, r);
    out.push({
      jobId: r.id,
      title: r.title,
      shopName: r.shop_name,
      status: r.status,
      statusLabel: JOB_STATUS_LABELS[r.status],
      priceCents: r.price_cents,
      chargedCents: Number(r.charged),
      feesCents: Number(r.fees),
      transferredCents: Number(r.transferred),
      refundedCents: Number(r.refunded),
      stillHeldCents: Number(r.held),
      balanced: problems.length === 0,
      problems,
    });
  }
  return out;
}

export interface MonthLedgerLine {
  month: string;
  chargedCents: number;
  feesCents: number;
  transferredCents: number;
  refundedCents: number;
  /** Net change of what is held for jobs during the month. */
  heldChangeCents: number;
}

/** Totals of the money events booked in each calendar month (UTC), newest first. */
export async function ledgerByMonth(db: Knex): Promise<MonthLedgerLine[]> {
  const rows = (await db('ledger_entries as e')
    .join('ledger_transactions as t', 't.id', 'e.transaction_id')
    .groupByRaw(`1`)
    .orderByRaw(`1 desc`)
    .select(
      db.raw(`to_char(date_trunc('month', t.created_at at time zone 'UTC'), 'YYYY-MM') as month`),
      db.raw(`${money('charge', 'processor')} as charged`),
      db.raw(`${money('refund', 'processor', -1)} as refunded`),
      db.raw(`(${money('transfer', 'processor', -1)} - ${money('reversal', 'processor')}) as transferred`),
      db.raw(`coalesce(sum(case when e.account = 'platform_fees' then -e.amount_cents end), 0)::bigint as fees`),
      db.raw(`coalesce(sum(case when e.account in ('rider_funds_held','builder_payable','refunds_payable') then -e.amount_cents end), 0)::bigint as held`),
    )) as { month: string; charged: string; refunded: string; transferred: string; fees: string; held: string }[];
  return rows.map((r) => ({
    month: r.month,
    chargedCents: Number(r.charged),
    feesCents: Number(r.fees),
    transferredCents: Number(r.transferred),
    refundedCents: Number(r.refunded),
    heldChangeCents: Number(r.held),
  }));
}

const MONTH = /^\d{4}-(0[1-9]|1[0-2])$/;

function csvCell(value: string | number | null): string {
  const text = value === null ? '' : String(value);
  // Quote everything textual; a leading formula character is neutralised for spreadsheet safety.
  const safe = /^[=+\-@]/.test(text) && typeof value === 'string' ? `'${text}` : text;
  return typeof value === 'number' ? safe : `"${safe.replace(/"/g, '""')}"`;
}

/** Every ledger entry (optionally of one month, `YYYY-MM` UTC) as CSV, debits and credits in cents. */
export async function ledgerCsv(db: Knex, opts: { month?: string } = {}): Promise<string> {
  const q = db('ledger_entries as e')
    .join('ledger_transactions as t', 't.id', 'e.transaction_id')
    .orderBy([{ column: 't.created_at' }, { column: 'e.id' }])
    .select('t.created_at', 'e.job_id', 't.id as transaction_id', 't.kind', 'e.account', 'e.amount_cents', 't.external_ref', 't.memo');
  if (opts.month && MONTH.test(opts.month)) {
    const start = new Date(`${opts.month}-01T00:00:00Z`);
    const end = new Date(Date.UTC(start.getUTCFullYear(), start.getUTCMonth() + 1, 1));
    q.where('t.created_at', '>=', start).andWhere('t.created_at', '<', end);
  }
  const rows = (await q) as { created_at: Date; job_id: string; transaction_id: string; kind: string; account: string; amount_cents: string; external_ref: string | null; memo: string }[];
  const header = ['booked_at_utc', 'job_id', 'transaction_id', 'kind', 'account', 'debit_cents', 'credit_cents', 'reference', 'memo'].join(',');
  const lines = rows.map((r) => {
    const amount = Number(r.amount_cents);
    return [
      csvCell(new Date(r.created_at).toISOString()),
      csvCell(r.job_id),
      csvCell(r.transaction_id),
      csvCell(r.kind),
      csvCell(r.account),
      amount > 0 ? amount : '',
      amount < 0 ? -amount : '',
      csvCell(r.external_ref),
      csvCell(r.memo),
    ].join(',');
  });
  return [header, ...lines].join('\r\n') + '\r\n';
}

/** The CSV export an admin downloads; the export itself is written to the audit log. */
export async function exportLedgerCsv(db: Knex, admin: SessionUser, opts: { month?: string } = {}): Promise<{ filename: string; csv: string }> {
  if (admin.role !== 'admin') throw new Forbidden('Only admins export the ledger.');
  const month = opts.month && MONTH.test(opts.month) ? opts.month : undefined;
  const csv = await ledgerCsv(db, { month });
  await writeAudit(db, admin, { action: 'ledger.exported', targetType: 'ledger', targetId: month ?? 'all', details: { rows: csv.split('\r\n').length - 2 } });
  return { filename: `lacewright-ledger-${month ?? 'all'}.csv`, csv };
}
