import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { webhookSecret } from '@/lib/payments/envContext';
import { handleWebhook } from '@/lib/payments/webhook';

// The payments processor's events: the raw body is verified against the signature header (400 when
// missing or wrong) and each event id is handled once; any other failure answers 500 so it is retried.
export const POST = route({ access: 'public' }, async ({ req }) =>
  handleWebhook(paymentsContext(), await req.text(), req.headers.get('stripe-signature'), webhookSecret()),
);
