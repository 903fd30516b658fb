import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { deleteUpload } from '@/lib/storage/deleteUpload';

// Remove a photo; only the person who uploaded it.
export const DELETE = route<undefined, { id: string }>({ access: 'signed-in' }, async ({ user, params }) => {
  await deleteUpload(db, user!, params.id);
  return { ok: true };
});
