import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { confirmReceipt } from '@/lib/payments/fulfilment';

// The rider confirms receipt; the escrow is released to the builder less the referral fee.
export const POST = route<undefined, { id: string }>({ access: { roles: ['rider'] } }, async ({ user, params }) => confirmReceipt(paymentsContext(), user!, params.id));
