import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { requestInputSchema, type RequestInput } from '@/lib/market/schema';
import { updateRequest } from '@/lib/market/updateRequest';

type Params = { id: string };

// One request as the viewer may see it; the rider replaces its details while it is still editable.
export const GET = route<undefined, Params>({ access: 'signed-in' }, async ({ user, params }) => getRequestForViewer(db, user!, params.id));

export const PATCH = route<RequestInput, Params>({ access: { roles: ['rider'] }, body: requestInputSchema }, async ({ user, params, body }) =>
  updateRequest(db, user!, params.id, body),
);
