import { route } from '@/lib/http/route';
import { cancelJob } from '@/lib/payments/cancel';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { cancelInputSchema, type CancelInput } from '@/lib/payments/schema';

// The rider or the builder cancels, by the refund policy: { reason? }.
export const POST = route<CancelInput, { id: string }>({ access: { roles: ['rider', 'builder'] }, body: cancelInputSchema }, async ({ user, params, body }) =>
  cancelJob(paymentsContext(), user!, params.id, body),
);
