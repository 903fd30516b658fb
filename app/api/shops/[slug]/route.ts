import { currentUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { getShopProfile } from '@/lib/shops/profile';

// A shop's public profile: anyone may read it; a member also learns they may add portfolio photos.
export const GET = route<undefined, { slug: string }>({ access: 'public' }, async ({ params }) => getShopProfile(db, params.slug, await currentUser()));
