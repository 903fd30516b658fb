import { db } from '@/lib/db';
import { createAccount } from '@/lib/auth/accounts';
import { signUpSchema } from '@/lib/auth/schema';
import { route, withStatus } from '@/lib/http/route';

// Sign-up: a rider, or a builder with their shop.
export const POST = route({ access: 'public', body: signUpSchema }, async ({ body }) => {
  const user = await createAccount(db, body);
  return withStatus(201, { id: user.id, role: user.role, shopId: user.shopId });
});
