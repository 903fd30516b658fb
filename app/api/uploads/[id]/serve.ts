import { currentUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { readUploadImage } from '@/lib/storage/readUploadImage';

/** GET handler for a photo variant: public for portfolios, otherwise only for those who may see the subject (404 to others). */
export function imageResponse(variant: 'image' | 'thumb') {
  return route<undefined, { id: string }>({ access: 'public' }, async ({ params }) => {
    const image = await readUploadImage(db, await currentUser(), params.id, variant);
    const headers = new Headers({
      'Content-Type': image.contentType,
      'Cache-Control': image.cacheControl,
      'X-Content-Type-Options': 'nosniff',
      'Content-Disposition': 'inline',
    });
    if (image.bytes !== undefined) headers.set('Content-Length', String(image.bytes));
    if (image.etag) headers.set('ETag', image.etag);
    return new Response(image.body, { headers });
  });
}
