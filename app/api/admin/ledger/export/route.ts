import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { exportLedgerCsv } from '@/lib/payments/ledgerReports';

// Every ledger entry as CSV (?month=YYYY-MM for one month, UTC); the export is written to the audit log.
export const GET = route({ access: { roles: ['admin'] } }, async ({ user, req }) => {
  const { filename, csv } = await exportLedgerCsv(db, user!, { month: new URL(req.url).searchParams.get('month') ?? undefined });
  return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${filename}"`, 'cache-control': 'no-store' } });
});
