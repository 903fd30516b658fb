import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { ledgerByJob, ledgerByMonth } from '@/lib/payments/ledgerReports';

// The ledger report: each job's books (with a balance check) and totals by month, UTC.
export const GET = route({ access: { roles: ['admin'] } }, async () => ({ jobs: await ledgerByJob(db), months: await ledgerByMonth(db) }));
