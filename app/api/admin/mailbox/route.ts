import { isDemo } from '@/lib/env';
import { NotFound } from '@/lib/errors';
import { route } from '@/lib/http/route';
import { listCaughtMail } from '@/lib/mail/mailbox';

// Captured demo mail, for admins.
export const GET = route({ access: { roles: ['admin'] } }, async () => {
  if (!isDemo) throw new NotFound('The mailbox exists only in demo mode.');
  return listCaughtMail();
});
