import { QueryProvider } from '@/components/providers/QueryProvider';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { payoutStatus } from '@/lib/payments/payoutAccounts';
import { PayoutSetupButton } from './page-client';

export const metadata = { title: 'Payouts' };
export const dynamic = 'force-dynamic';

// A builder's payout setup. The payment service's page collects the details; we keep only the account
// reference and whether it can receive transfers. Coming back from that page refreshes the status.
export default async function PayoutsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser(['builder'], '/payouts');
  const query = await searchParams;
  const status = await payoutStatus(paymentsContext(), user);
  return (
    <QueryProvider>
      <PageHeading title="Payouts" lead="Where the money for your builds goes. Riders can pay into escrow for your bids once this is set up." />
      <div className="max-w-2xl space-y-4">
        {query.link === 'expired' && <Notice tone="caution">That setup link had expired or was already used. Start again below; it only takes a moment.</Notice>}
        {status.stale && <Notice tone="caution">We could not reach the payment service just now, so this status may be out of date. Reload in a minute.</Notice>}
        <div data-testid="payout-status" data-state={status.state}>
          <Card className="space-y-3">
            {status.state === 'active' && (
              <>
                <Notice tone="success" title="Payouts are on">
                  Riders can pay into escrow for your bids. When a rider confirms receipt, the price less our referral fee is transferred to your payout account.
                </Notice>
                <p className="text-sm text-ink-500">Payout account {status.accountId}</p>
                <PayoutSetupButton label="Review payout details" tone="secondary" />
              </>
            )}
            {status.state === 'onboarding' && (
              <>
                <Notice tone="caution" title="Not finished yet">
                  Your payout account exists but the payment service still needs your details. Riders cannot pay you until this is done.
                </Notice>
                <PayoutSetupButton label="Continue payout setup" />
              </>
            )}
            {status.state === 'not_started' && (
              <>
                <p className="text-sm text-ink-700">
                  You will enter your business and bank details on the payment service&apos;s own page, not on Lacewright. We never see your bank details.
                </p>
                <PayoutSetupButton label="Set up payouts" />
              </>
            )}
          </Card>
        </div>
        <Notice tone="info" title="How you are paid">
          The rider&apos;s money is held in escrow from the day they pay. Do not order parts or start work before the job shows it is paid. You are paid when the rider confirms receipt, or automatically a set number of days after you ship if no dispute is open.
        </Notice>
      </div>
    </QueryProvider>
  );
}
