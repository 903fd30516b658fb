import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { listAudit } from '@/lib/payments/audit';

// The admin audit log, newest first: ?before=<id> pages back.
export const GET = route({ access: { roles: ['admin'] } }, async ({ req }) => ({ entries: await listAudit(db, { beforeId: new URL(req.url).searchParams.get('before') ?? undefined }) }));
