// The processor's events. The signature is checked on the raw body (400 when missing or wrong); each
// event id is handled once, in the same transaction as its effects, so a failure leaves no trace and the
// processor's retry does the work. Handlers read the object's current facts rather than trusting order:
// a late "succeeded" for a job that has moved on books the charge and refunds it, a repeat changes nothing.
import type { Knex } from 'knex';
import Stripe from 'stripe';
import { Invalid } from '@/lib/errors';
import { paymentReceivedMail } from '@/lib/mail/notices';
import type { PaymentsContext } from './context';
import { refundToRider } from './escrow';
import { isJobId, lockJob, moveJob, type JobRow } from './jobStates';
import { assertJobBalances, bookCharge, bookReversal } from './ledger';
import type { PaymentRow } from './pay';
import { applyAccountState } from './payoutAccounts';
import { jobTitle, mailEach, riderAddress, shopAddresses } from './people';
import { recordTransfer } from './payouts';
import { describeFailure } from './processorErrors';
import { recordRefund, sendRefund } from './refunds';

const verifier = new Stripe('sk_test_signature_check_only', { telemetry: false });

export class BadSignature extends Invalid {
  constructor() {
    super('The webhook signature is missing or does not match.');
  }
}

/** Checks the signature header against the raw body; throws BadSignature (400) otherwise. */
export function verifyEvent(rawBody: string, signature: string | null, secret: string): Stripe.Event {
  if (!signature) throw new BadSignature();
  try {
    return verifier.webhooks.constructEvent(rawBody, signature, secret);
  } catch {
    throw new BadSignature();
  }
}

export interface WebhookResult {
  eventId: string;
  type: string;
  outcome: string;
}

type Effects = { refundsToSend: string[] };
type Handler = (trx: Knex.Transaction, ctx: PaymentsContext, event: Stripe.Event, effects: Effects) => Promise<string>;

async function lockJobOf(trx: Knex.Transaction, metadata: Stripe.Metadata | null | undefined): Promise<JobRow | null> {
  const jobId = metadata?.jobId;
  if (!jobId || !isJobId(jobId)) return null;
  const exists = await trx('jobs').where({ id: jobId }).first('id');
  return exists ? lockJob(trx, jobId) : null;
}

async function paymentRowFor(trx: Knex.Transaction, job: JobRow, pi: Stripe.PaymentIntent): Promise<PaymentRow> {
  const byIntent = (await trx('payments').where({ payment_intent_id: pi.id }).first().forUpdate()) as PaymentRow | undefined;
  if (byIntent) return byIntent;
  const paymentId = pi.metadata?.paymentId;
  if (paymentId && isJobId(paymentId)) {
    const byId = (await trx('payments').where({ id: paymentId, job_id: job.id }).first().forUpdate()) as PaymentRow | undefined;
    if (byId) {
      await trx('payments').where({ id: byId.id }).update({ payment_intent_id: pi.id });
      return { ...byId, payment_intent_id: pi.id };
    }
  }
  // An intent we have no row for (made outside this app): keep a record of it all the same.
  const attempt = Number((await trx('payments').where({ job_id: job.id }).max<{ max: number | null }[]>({ max: 'attempt' }))[0].max ?? 0) + 1;
  const [row] = (await trx('payments')
    .insert({ job_id: job.id, attempt, idempotency_key: `external:${pi.id}`, payment_intent_id: pi.id, amount_cents: pi.amount, currency: pi.currency, status: 'creating' })
    .returning('*')) as PaymentRow[];
  return row;
}

const handlers: Record<string, Handler> = {
  async 'payment_intent.succeeded'(trx, ctx, event, effects) {
    const pi = event.data.object as Stripe.PaymentIntent;
    const job = await lockJobOf(trx, pi.metadata);
    if (!job) return 'ignored: no job';
    const payment = await paymentRowFor(trx, job, pi);
    const chargeId = typeof pi.latest_charge === 'string' ? pi.latest_charge : pi.latest_charge?.id;
    if (!chargeId) return 'ignored: no charge';
    await trx('payments').where({ id: payment.id }).update({ status: 'succeeded', charge_id: chargeId, last_error: null, updated_at: trx.fn.now() });
    const booked = await bookCharge(trx, job.id, chargeId, pi.amount_received);
    if (!booked) return 'duplicate: charge already booked';

    if (job.status === 'awaiting_payment' && pi.amount_received === job.price_cents) {
      await moveJob(trx, job, 'fund', { funded_at: new Date(), payment_intent_id: pi.id, charge_id: chargeId, fee_bps: job.fee_bps ?? ctx.settings.feeBps });
      const title = await jobTitle(trx, job.request_id);
      await mailEach(trx, 'payment.received', [await riderAddress(trx, job.rider_id)], (to) => paymentReceivedMail(to, { jobId: job.id, title, priceCents: job.price_cents, audience: 'rider' }));
      await mailEach(trx, 'payment.received', await shopAddresses(trx, job.shop_id), (to) => paymentReceivedMail(to, { jobId: job.id, title, priceCents: job.price_cents, audience: 'builder' }));
      await assertJobBalances(trx, job.id);
      return 'funded';
    }
    // Money for a job that no longer wants it (cancelled, or already paid): it goes straight back.
    const refundId = await refundToRider(trx, job, {
      amountCents: pi.amount_received,
      paymentIntentId: pi.id,
      chargeId,
      reason: 'late_payment',
      memo: `Payment arrived while the job was ${job.status}; returned to the rider`,
    });
    if (refundId) effects.refundsToSend.push(refundId);
    await assertJobBalances(trx, job.id);
    return `refunding: job was ${job.status}`;
  },

  async 'payment_intent.payment_failed'(trx, _ctx, event) {
    const pi = event.data.object as Stripe.PaymentIntent;
    const job = await lockJobOf(trx, pi.metadata);
    if (!job) return 'ignored: no job';
    const payment = await paymentRowFor(trx, job, pi);
    if (payment.status === 'succeeded') return 'ignored: already succeeded';
    await trx('payments')
      .where({ id: payment.id })
      .update({ status: 'requires_payment_method', last_error: pi.last_payment_error?.message ?? 'The card was declined.', updated_at: trx.fn.now() });
    return 'payment failed recorded';
  },

  async 'payment_intent.canceled'(trx, _ctx, event) {
    const pi = event.data.object as Stripe.PaymentIntent;
    const job = await lockJobOf(trx, pi.metadata);
    if (!job) return 'ignored: no job';
    const payment = await paymentRowFor(trx, job, pi);
    if (payment.status === 'succeeded') return 'ignored: already succeeded';
    await trx('payments').where({ id: payment.id }).update({ status: 'canceled', updated_at: trx.fn.now() });
    return 'canceled recorded';
  },

  async 'refund.created'(trx, ctx, event) {
    const refund = event.data.object as Stripe.Refund;
    const rowId = refund.metadata?.refundRowId;
    if (!rowId || !isJobId(rowId)) return 'ignored: not ours';
    return (await recordRefund(trx, rowId, refund)) ? 'refund recorded' : 'duplicate: refund already recorded';
  },

  async 'charge.refunded'(trx, _ctx, event) {
    const charge = event.data.object as Stripe.Charge;
    const rows = (await trx('refunds').where({ charge_id: charge.id }).select('status', 'amount_cents')) as { status: string; amount_cents: number }[];
    const known = rows.reduce((s, r) => s + r.amount_cents, 0);
    if (charge.amount_refunded > known) return `noted: ${charge.amount_refunded - known} cents refunded outside this app`;
    return 'noted';
  },

  async 'transfer.created'(trx, _ctx, event) {
    const transfer = event.data.object as Stripe.Transfer;
    const payoutId = transfer.metadata?.payoutId;
    if (!payoutId || !isJobId(payoutId)) return 'ignored: not ours';
    return (await recordTransfer(trx, payoutId, transfer)) ? 'transfer recorded' : 'duplicate: transfer already recorded';
  },

  async 'transfer.reversed'(trx, _ctx, event) {
    const transfer = event.data.object as Stripe.Transfer;
    const job = await lockJobOf(trx, transfer.metadata);
    if (!job) return 'ignored: no job';
    const booked = Number(
      (await trx('ledger_transactions as t').join('ledger_entries as e', 'e.transaction_id', 't.id').where({ 't.kind': 'reversal', 'e.account': 'processor' }).andWhere('t.external_ref', 'like', `${transfer.id}:%`).sum<{ s: string | null }[]>({ s: 'e.amount_cents' }))[0].s ?? 0,
    );
    const delta = transfer.amount_reversed - booked;
    if (delta <= 0) return 'duplicate: reversal already booked';
    await bookReversal(trx, job.id, `${transfer.id}:${transfer.amount_reversed}`, delta);
    await assertJobBalances(trx, job.id);
    return `reversal of ${delta} booked`;
  },

  async 'account.updated'(trx, _ctx, event) {
    const account = event.data.object as Stripe.Account;
    const applied = await applyAccountState(trx, account, new Date(event.created * 1000));
    return applied ? 'account updated' : 'ignored: older than what we know';
  },
};

/** Verifies, deduplicates and handles one delivery. Throws BadSignature for a bad or missing signature. */
export async function handleWebhook(ctx: PaymentsContext, rawBody: string, signature: string | null, secret: string): Promise<WebhookResult> {
  const event = verifyEvent(rawBody, signature, secret);
  const effects: Effects = { refundsToSend: [] };
  const outcome = await ctx.db.transaction(async (trx) => {
    const object = event.data.object as { id?: string };
    const inserted = await trx('webhook_events')
      .insert({ id: event.id, type: event.type, object_id: object.id ?? null, outcome: 'handling', event_created_at: new Date(event.created * 1000) })
      .onConflict('id')
      .ignore()
      .returning('id');
    if (inserted.length === 0) return 'duplicate event';
    const handler = handlers[event.type];
    const result = handler ? await handler(trx, ctx, event, effects) : 'ignored: not used';
    await trx('webhook_events').where({ id: event.id }).update({ outcome: result });
    return result;
  });

  // Calls to the processor wait until the event and its effects are committed.
  for (const id of effects.refundsToSend) {
    await sendRefund(ctx, id).catch((err) => console.warn(`payments: refund ${id} will be retried: ${describeFailure(err)}`));
  }
  return { eventId: event.id, type: event.type, outcome };
}
