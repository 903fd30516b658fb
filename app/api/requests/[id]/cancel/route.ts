import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { cancelRequest } from '@/lib/market/cancelRequest';

export const POST = route<undefined, { id: string }>({ access: { roles: ['rider'] } }, async ({ user, params }) => cancelRequest(db, user!, params.id));
