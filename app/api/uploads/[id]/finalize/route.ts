import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { finalizeUpload } from '@/lib/storage/finalizeUpload';

// After the PUT: check the stored file by content, clean it and make the thumbnail (422/413 when refused).
export const POST = route<undefined, { id: string }>({ access: 'signed-in' }, async ({ user, params }) => {
  return finalizeUpload(db, user!, params.id);
});
