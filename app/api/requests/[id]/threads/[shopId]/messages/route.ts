import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { listThreadMessages, postMessage } from '@/lib/market/messages';
import { messageInputSchema } from '@/lib/market/schema';

type Params = { id: string; shopId: string };

// Reading the thread marks it read for the viewer.
export const GET = route<undefined, Params>({ access: 'signed-in' }, async ({ user, params }) => listThreadMessages(db, user!, params.id, params.shopId));

export const POST = route<{ body: string }, Params>({ access: { roles: ['rider', 'builder'] }, body: messageInputSchema }, async ({ user, params, body }) =>
  withStatus(201, await postMessage(db, user!, params.id, params.shopId, body.body)),
);
