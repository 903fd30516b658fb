import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { listDisputes } from '@/lib/payments/disputes';

// The disputes queue, open ones first: ?status=open|resolved to filter.
export const GET = route({ access: { roles: ['admin'] } }, async ({ req }) => {
  const status = new URL(req.url).searchParams.get('status');
  return { disputes: await listDisputes(db, { status: status === 'open' || status === 'resolved' ? status : undefined }) };
});
