import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { createRequest } from '@/lib/market/createRequest';
import { listRiderRequests } from '@/lib/market/listRiderRequests';
import { createRequestBodySchema } from '@/lib/market/schema';

// A rider's requests (admins: everyone's), and posting a new one as a draft or published.
export const GET = route({ access: { roles: ['rider', 'admin'] } }, async ({ user }) => ({ requests: await listRiderRequests(db, user!) }));

export const POST = route({ access: { roles: ['rider'] }, body: createRequestBodySchema }, async ({ user, body }) => {
  const { publish, ...input } = body;
  return withStatus(201, await createRequest(db, user!, input, { publish }));
});
