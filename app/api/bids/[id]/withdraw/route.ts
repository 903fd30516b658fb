import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { withdrawBid } from '@/lib/market/withdrawBid';

export const POST = route<undefined, { id: string }>({ access: { roles: ['builder'] } }, async ({ user, params }) => withdrawBid(db, user!, params.id));
