import 'server-only';
import { cache } from 'react';
import { getServerSession } from 'next-auth';
import { redirect } from 'next/navigation';
import { db } from '@/lib/db';
import { Forbidden, Unauthorized } from '@/lib/errors';
import { loadSessionUser } from './accounts';
import { authOptions } from './options';
import type { Role, SessionUser } from './roles';

/** The signed-in user with role and shop read fresh from the database, once per request. */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  return id ? loadSessionUser(db, id) : null;
});

/** The one authorization check: 401 without a session, 403 with the wrong role. */
export function authorize(user: SessionUser | null, roles?: readonly Role[]): SessionUser {
  if (!user) throw new Unauthorized();
  if (roles && !roles.includes(user.role)) throw new Forbidden();
  return user;
}

/** For route handlers and server actions. */
export async function requireUser(roles?: readonly Role[]): Promise<SessionUser> {
  return authorize(await currentUser(), roles);
}

/** For pages: sends a visitor to sign in, and a signed-in user without the role to the not-allowed page. */
export async function requirePageUser(roles: readonly Role[] | undefined, returnTo: string): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
  if (roles && !roles.includes(user.role)) redirect('/not-allowed');
  return user;
}
