import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { markShipped } from '@/lib/payments/fulfilment';
import { shipInputSchema, type ShipInput } from '@/lib/payments/schema';

// The builder hands the wheel over: { handover: 'carrier', carrier, trackingNumber } or { handover: 'pickup' }.
export const POST = route<ShipInput, { id: string }>({ access: { roles: ['builder'] }, body: shipInputSchema }, async ({ user, params, body }) =>
  markShipped(paymentsContext(), user!, params.id, body),
);
