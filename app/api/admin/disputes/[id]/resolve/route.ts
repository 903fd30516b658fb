import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { resolveDispute } from '@/lib/payments/disputes';
import { resolveInputSchema, type ResolveInput } from '@/lib/payments/schema';

// An admin settles a dispute: { resolution: 'release' | 'refund' | 'split', refundCents?, reason }. Audited.
export const POST = route<ResolveInput, { id: string }>({ access: { roles: ['admin'] }, body: resolveInputSchema }, async ({ user, params, body }) =>
  resolveDispute(paymentsContext(), user!, params.id, body),
);
