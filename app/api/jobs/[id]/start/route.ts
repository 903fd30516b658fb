import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { startBuild } from '@/lib/payments/fulfilment';

// The builder starts the build of a paid job.
export const POST = route<undefined, { id: string }>({ access: { roles: ['builder'] } }, async ({ user, params }) => startBuild(paymentsContext(), user!, params.id));
