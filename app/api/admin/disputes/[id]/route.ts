import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { getDisputeForAdmin } from '@/lib/payments/disputes';

// One dispute with its job, the money held, both sides' thread and the request's messages.
export const GET = route<undefined, { id: string }>({ access: { roles: ['admin'] } }, async ({ user, params }) => getDisputeForAdmin(paymentsContext(), user!, params.id));
