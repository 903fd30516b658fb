import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { getJobForViewer } from '@/lib/payments/jobView';

// One job as its rider, its shop or an admin sees it, with the actions this viewer may take.
export const GET = route<undefined, { id: string }>({ access: 'signed-in' }, async ({ user, params }) => getJobForViewer(paymentsContext(), user!, params.id));
