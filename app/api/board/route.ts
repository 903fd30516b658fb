import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { boardPage } from '@/lib/market/board';
import { boardQuerySchema } from '@/lib/market/schema';

// Open requests for builders: filters, sort and cursor paging from the query string.
export const GET = route({ access: { roles: ['builder'] } }, async ({ user, req }) => {
  const query = boardQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return boardPage(db, user!, query);
});
