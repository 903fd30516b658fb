import { currentUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { createUpload } from '@/lib/storage/createUpload';
import { listUploads } from '@/lib/storage/listUploads';
import { createUploadSchema, listUploadsQuerySchema } from '@/lib/storage/schema';

// Start a photo upload: answers with a presigned URL the browser PUTs the file to, then calls finalize.
export const POST = route({ access: 'signed-in', body: createUploadSchema }, async ({ user, body }) => {
  return withStatus(201, await createUpload(db, user!, body));
});

// The ready photos of one request, shop portfolio or job. Portfolios are public, so no sign-in is required here.
export const GET = route({ access: 'public' }, async ({ req }) => {
  const params = new URL(req.url).searchParams;
  const query = listUploadsQuerySchema.parse({ purpose: params.get('purpose'), subjectId: params.get('subjectId') });
  return listUploads(db, await currentUser(), query);
});
