import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { openDispute } from '@/lib/payments/disputes';
import { disputeInputSchema, type DisputeInput } from '@/lib/payments/schema';

// The rider or the builder opens a dispute, which freezes the money: { reason, details }.
export const POST = route<DisputeInput, { id: string }>({ access: { roles: ['rider', 'builder'] }, body: disputeInputSchema }, async ({ user, params, body }) =>
  openDispute(paymentsContext(), user!, params.id, body),
);
