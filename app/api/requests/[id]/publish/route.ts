import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { publishRequest } from '@/lib/market/publishRequest';

export const POST = route<undefined, { id: string }>({ access: { roles: ['rider'] } }, async ({ user, params }) => publishRequest(db, user!, params.id));
