import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { startPayment } from '@/lib/payments/pay';

// The rider starts paying into escrow: { redirectUrl } of the payment page. 409 when not payable, 503 when the service is down.
export const POST = route<undefined, { id: string }>({ access: { roles: ['rider'] } }, async ({ user, params }) => startPayment(paymentsContext(), user!, params.id));
