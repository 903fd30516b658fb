import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { reviseBid } from '@/lib/market/reviseBid';
import { bidInputSchema, type BidInput } from '@/lib/market/schema';

// Revise a live bid: the whole bid is sent again.
export const PATCH = route<BidInput, { id: string }>({ access: { roles: ['builder'] }, body: bidInputSchema }, async ({ user, params, body }) =>
  reviseBid(db, user!, params.id, body),
);
