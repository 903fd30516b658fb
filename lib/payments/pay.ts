// Paying into escrow: one payment intent per attempt, keyed `job:<id>:pay:<attempt>`, written down before
// the processor is called so a lost answer is retried under the same key. The rider pays on the
// processor's hosted page; only the processor's webhook marks the job funded (webhook.ts).
import type Stripe from 'stripe';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict } from '@/lib/errors';
import { payoutSetupNeededMail } from '@/lib/mail/notices';
import type { PaymentsContext } from './context';
import { requireSide } from './jobAccess';
import { assertJobMove, lockJob } from './jobStates';
import { shopPayoutsReady } from './payoutAccounts';
import { jobTitle, mailEach, shopAddresses } from './people';
import { describeFailure, failureKind, PaymentsRefused, PaymentsUnavailable } from './processorErrors';

export type PaymentStatus = 'creating' | 'failed' | 'requires_payment_method' | 'requires_action' | 'processing' | 'succeeded' | 'canceled';
export const OPEN_PAYMENT_STATUSES: readonly PaymentStatus[] = ['requires_payment_method', 'requires_action'];

export interface PaymentRow {
  id: string;
  job_id: string;
  attempt: number;
  idempotency_key: string;
  payment_intent_id: string | null;
  charge_id: string | null;
  amount_cents: number;
  currency: string;
  status: PaymentStatus;
  hosted_url: string | null;
  last_error: string | null;
  close_attempts: number;
  created_at: Date;
  updated_at: Date;
}

export const payKey = (jobId: string, attempt: number) => `job:${jobId}:pay:${attempt}`;
export const paymentReturnUrl = (appUrl: string, jobId: string) => `${appUrl}/jobs/${jobId}/payment-return`;

type Plan = { kind: 'open'; url: string } | { kind: 'create'; payment: PaymentRow; title: string } | { kind: 'blocked' };

/** The hosted payment page of an intent, with the way back to our return page. */
function hostedUrl(pi: Stripe.PaymentIntent, returnUrl: string): string | null {
  const url = pi.next_action?.redirect_to_url?.url;
  if (!url) return null;
  const u = new URL(url);
  if (!u.searchParams.has('return_url')) u.searchParams.set('return_url', returnUrl);
  return u.toString();
}

/**
 * The rider starts (or resumes) paying for a job: returns the processor page to send them to.
 * Refuses with 409 unless the job awaits payment and the shop can receive payouts; 503 when the
 * processor cannot be reached (the job stays awaiting payment and trying again later works).
 */
export async function startPayment(ctx: PaymentsContext, actor: SessionUser, jobId: string): Promise<{ redirectUrl: string }> {
  const { db, stripe, settings } = ctx;
  const plan: Plan = await db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    requireSide(actor, job, ['rider']);
    const latest = (await trx('payments').where({ job_id: job.id }).orderBy('attempt', 'desc').first()) as PaymentRow | undefined;
    if (job.status === 'awaiting_payment' && latest?.status === 'succeeded') {
      throw new Conflict('We have your payment and are confirming it with the payment service. This page updates in a moment.');
    }
    assertJobMove(job.status, 'fund');
    if (!(await shopPayoutsReady(trx, job.shop_id))) {
      const title = await jobTitle(trx, job.request_id);
      await mailEach(trx, 'payout.setup-needed', await shopAddresses(trx, job.shop_id), (to) => payoutSetupNeededMail(to, { jobId: job.id, title }), (to) => `job:${job.id}:payout-setup-needed:${to}`);
      return { kind: 'blocked' };
    }
    if (job.fee_bps === null) await trx('jobs').where({ id: job.id }).update({ fee_bps: settings.feeBps, updated_at: trx.fn.now() });
    if (latest && latest.status === 'processing') throw new Conflict('Your payment is being processed. This page updates when it is done.');
    if (latest && latest.hosted_url && OPEN_PAYMENT_STATUSES.includes(latest.status)) return { kind: 'open', url: latest.hosted_url };
    const title = await jobTitle(trx, job.request_id);
    // A call whose answer never came is retried under its own key; anything else starts a new attempt.
    if (latest && latest.status === 'creating') return { kind: 'create', payment: latest, title };
    const attempt = (latest?.attempt ?? 0) + 1;
    const [payment] = (await trx('payments')
      .insert({ job_id: job.id, attempt, idempotency_key: payKey(job.id, attempt), amount_cents: job.price_cents, currency: job.currency, status: 'creating' })
      .returning('*')) as PaymentRow[];
    return { kind: 'create', payment, title };
  });

  if (plan.kind === 'blocked') {
    throw new Conflict('The builder has not finished setting up payouts yet, so there is nowhere to hold the money for them. We have reminded them; you can pay as soon as they are done.');
  }
  if (plan.kind === 'open') return { redirectUrl: plan.url };

  const { payment, title } = plan;
  const returnUrl = paymentReturnUrl(settings.appUrl, jobId);
  let pi: Stripe.PaymentIntent;
  try {
    pi = await stripe.paymentIntents.create(
      {
        amount: payment.amount_cents,
        currency: payment.currency,
        description: `Lacewright escrow: ${title}`.slice(0, 200),
        transfer_group: jobId,
        metadata: { jobId, paymentId: payment.id },
        return_url: returnUrl,
      } as Stripe.PaymentIntentCreateParams,
      { idempotencyKey: payment.idempotency_key },
    );
  } catch (err) {
    const answered = failureKind(err) === 'answered';
    await db.transaction(async (trx) => {
      await lockJob(trx, jobId);
      await trx('payments')
        .where({ id: payment.id, status: 'creating' })
        .update({ status: answered ? 'failed' : 'creating', last_error: describeFailure(err), updated_at: trx.fn.now() });
    });
    console.warn(`payments: could not create the payment for job ${jobId}: ${describeFailure(err)}`);
    const status = (err as { statusCode?: number }).statusCode;
    if (!answered || status === undefined || status >= 500 || status === 429) throw new PaymentsUnavailable();
    throw new PaymentsRefused('The payment service refused this payment. Nothing was charged; please try again, or contact us if it keeps happening.');
  }
  const url = hostedUrl(pi, returnUrl);
  await db.transaction(async (trx) => {
    await lockJob(trx, jobId);
    // The webhook may have got here first; it knows better than this answer, so only a blank row is filled in.
    await trx('payments')
      .where({ id: payment.id })
      .update({
        payment_intent_id: pi.id,
        hosted_url: url,
        status: trx.raw(`case when status in ('creating','failed') then ? else status end`, [pi.status]),
        last_error: trx.raw(`case when status in ('creating','failed') then null else last_error end`),
        updated_at: trx.fn.now(),
      });
  });
  if (!url) throw new Conflict('This payment cannot be paid on the payment page any more. Reload the job to see where it stands.');
  return { redirectUrl: url };
}
