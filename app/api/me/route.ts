import { route } from '@/lib/http/route';

// Who am I: the signed-in user's id, role and shop.
export const GET = route({ access: 'signed-in' }, async ({ user }) => user);
