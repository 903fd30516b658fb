import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { compareBids } from '@/lib/market/compareBids';

export const GET = route<undefined, { id: string }>({ access: { roles: ['rider', 'admin'] } }, async ({ user, params }) => compareBids(db, user!, params.id));
