import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { payoutStatus, startPayoutSetup } from '@/lib/payments/payoutAccounts';

// The builder's payout setup: GET the status (refreshed from the processor while onboarding),
// POST for a fresh onboarding link on the processor's page: { url }.
export const GET = route({ access: { roles: ['builder'] } }, async ({ user }) => payoutStatus(paymentsContext(), user!));
export const POST = route({ access: { roles: ['builder'] } }, async ({ user }) => startPayoutSetup(paymentsContext(), user!));
