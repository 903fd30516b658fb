import { db } from '@/lib/db';
import { createAccount } from '@/lib/auth/accounts';
import { signUpSchema } from '@/lib/auth/schema';
import { route, withStatus } from '@/lib/http/route';
import { limitSignUp } from '@/lib/security/limits';

// Sign-up: a rider, or a builder with their shop.
export const POST = route({ access: 'public', body: signUpSchema }, async ({ req, body }) => {
  const limited = await limitSignUp(req);
  if (limited) return limited;
  const user = await createAccount(db, body);
  return withStatus(201, { id: user.id, role: user.role, shopId: user.shopId });
});
