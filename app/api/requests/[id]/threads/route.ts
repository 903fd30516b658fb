import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { listThreads } from '@/lib/market/threads';

// The conversations on a request the viewer may see, with unread counts: a JSON array of ThreadSummary.
export const GET = route<undefined, { id: string }>({ access: 'signed-in' }, async ({ user, params }) => listThreads(db, user!, params.id));
