import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { listThreads } from '@/lib/market/threads';

// The conversations on a request the viewer may see, with unread counts.
export const GET = route<undefined, { id: string }>({ access: 'signed-in' }, async ({ user, params }) => ({ threads: await listThreads(db, user!, params.id) }));
