import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { acceptBid } from '@/lib/market/acceptBid';
import { acceptBidSchema } from '@/lib/market/schema';

// The request's rider accepts one bid; the others are declined.
export const POST = route<{ bidId: string }, { id: string }>({ access: { roles: ['rider'] }, body: acceptBidSchema }, async ({ user, params, body }) =>
  acceptBid(db, user!, params.id, body.bidId),
);
