import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { placeBid } from '@/lib/market/placeBid';
import { bidInputSchema, type BidInput } from '@/lib/market/schema';

export const POST = route<BidInput, { id: string }>({ access: { roles: ['builder'] }, body: bidInputSchema }, async ({ user, params, body }) =>
  withStatus(201, await placeBid(db, user!, params.id, body)),
);
