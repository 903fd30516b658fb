import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { listJobsForViewer } from '@/lib/payments/jobView';

// The signed-in person's jobs: a rider's, their shop's, or all of them for an admin.
export const GET = route({ access: 'signed-in' }, async ({ user }) => ({ jobs: await listJobsForViewer(paymentsContext(), user!) }));
