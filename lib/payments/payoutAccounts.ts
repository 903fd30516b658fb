// Builder payout setup: one connected account per shop at the processor, onboarded on the processor's
// own page. A rider can pay into escrow only once the shop's account can receive transfers.
import type { Knex } from 'knex';
import type Stripe from 'stripe';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden } from '@/lib/errors';
import type { PaymentsContext } from './context';
import { shopDisplayName } from './people';
import { describeFailure, failureKind, PaymentsRefused, PaymentsUnavailable } from './processorErrors';

export type PayoutSetupState = 'not_started' | 'onboarding' | 'active';

interface PayoutAccountRow {
  shop_id: string;
  account_id: string | null;
  status: 'creating' | 'onboarding' | 'active';
  create_attempt: number;
  links_issued: number;
  details_submitted: boolean;
  transfers_active: boolean;
  synced_at: Date | null;
}

export interface PayoutStatusView {
  state: PayoutSetupState;
  accountId: string | null;
  detailsSubmitted: boolean;
  /** True when the status could not be refreshed from the processor just now. */
  stale: boolean;
  syncedAt: string | null;
}

function requireBuilderShop(actor: SessionUser): string {
  if (actor.role !== 'builder' || !actor.shopId) throw new Forbidden('Only builders with a shop set up payouts.');
  return actor.shopId;
}

function view(row: PayoutAccountRow | undefined, stale = false): PayoutStatusView {
  if (!row || !row.account_id) return { state: 'not_started', accountId: null, detailsSubmitted: false, stale, syncedAt: null };
  return {
    state: row.status === 'active' ? 'active' : 'onboarding',
    accountId: row.account_id,
    detailsSubmitted: row.details_submitted,
    stale,
    syncedAt: row.synced_at ? new Date(row.synced_at).toISOString() : null,
  };
}

export async function shopPayoutsReady(db: Knex, shopId: string): Promise<boolean> {
  const row = await db('payout_accounts').where({ shop_id: shopId, status: 'active' }).first('shop_id');
  return Boolean(row);
}

export async function payoutAccountId(db: Knex, shopId: string): Promise<string | null> {
  const row = (await db('payout_accounts').where({ shop_id: shopId, status: 'active' }).first('account_id')) as { account_id: string } | undefined;
  return row?.account_id ?? null;
}

/** Applies what the processor says about an account; an older report never overwrites a newer one. */
export async function applyAccountState(db: Knex, account: Stripe.Account, observedAt: Date): Promise<boolean> {
  const active = account.capabilities?.transfers === 'active';
  const updated = await db('payout_accounts')
    .where({ account_id: account.id })
    .andWhere((q) => q.whereNull('synced_at').orWhere('synced_at', '<=', observedAt))
    .update({
      status: active ? 'active' : 'onboarding',
      details_submitted: Boolean(account.details_submitted),
      transfers_active: active,
      synced_at: observedAt,
      updated_at: db.fn.now(),
    });
  return updated > 0;
}

/** The shop's payout status; while onboarding it asks the processor for news (a read, safe to repeat). */
export async function payoutStatus(ctx: PaymentsContext, actor: SessionUser): Promise<PayoutStatusView> {
  const shopId = requireBuilderShop(actor);
  const row = (await ctx.db('payout_accounts').where({ shop_id: shopId }).first()) as PayoutAccountRow | undefined;
  if (!row?.account_id || row.status === 'active') return view(row);
  try {
    const account = await ctx.stripe.accounts.retrieve(row.account_id);
    await applyAccountState(ctx.db, account, new Date());
  } catch (err) {
    console.warn(`payouts: could not refresh account ${row.account_id}: ${describeFailure(err)}`);
    return view(row, true);
  }
  return view((await ctx.db('payout_accounts').where({ shop_id: shopId }).first()) as PayoutAccountRow);
}

/**
 * Starts or resumes payout setup: makes the shop's connected account once (keyed per shop and attempt)
 * and returns a fresh single-use onboarding link on the processor's page, which comes back to /payouts.
 */
export async function startPayoutSetup(ctx: PaymentsContext, actor: SessionUser): Promise<{ url: string }> {
  const shopId = requireBuilderShop(actor);
  const { db, stripe, settings } = ctx;
  const row = await db.transaction(async (trx) => {
    await trx('payout_accounts').insert({ shop_id: shopId }).onConflict('shop_id').ignore();
    const locked = (await trx('payout_accounts').where({ shop_id: shopId }).first().forUpdate()) as PayoutAccountRow;
    const [next] = (await trx('payout_accounts')
      .where({ shop_id: shopId })
      .update({ links_issued: locked.links_issued + 1, updated_at: trx.fn.now() })
      .returning('*')) as PayoutAccountRow[];
    return next;
  });

  let accountId = row.account_id;
  if (!accountId) {
    try {
      const account = await stripe.accounts.create(
        {
          type: 'express',
          country: 'US',
          email: actor.email,
          capabilities: { transfers: { requested: true } },
          business_profile: { name: await shopDisplayName(db, shopId), product_description: 'Custom bicycle wheel building' },
          metadata: { shopId },
        },
        { idempotencyKey: `shop:${shopId}:payout-account:${row.create_attempt}` },
      );
      await db('payout_accounts').where({ shop_id: shopId }).whereNull('account_id').update({ account_id: account.id, status: 'onboarding', updated_at: db.fn.now() });
      accountId = ((await db('payout_accounts').where({ shop_id: shopId }).first('account_id')) as { account_id: string }).account_id;
    } catch (err) {
      // An answer (even an error) is kept under the key by the processor, so the next try needs a new one.
      if (failureKind(err) === 'answered') await db('payout_accounts').where({ shop_id: shopId }).increment('create_attempt', 1);
      console.warn(`payouts: could not create an account for shop ${shopId}: ${describeFailure(err)}`);
      throw new PaymentsUnavailable('The payment service is not answering right now, so payout setup cannot start. Please try again in a few minutes.');
    }
  }

  try {
    const link = await stripe.accountLinks.create(
      {
        account: accountId,
        type: row.status === 'active' ? 'account_update' : 'account_onboarding',
        refresh_url: `${settings.appUrl}/payouts?link=expired`,
        return_url: `${settings.appUrl}/payouts?from=onboarding`,
      },
      { idempotencyKey: `shop:${shopId}:onboarding-link:${row.links_issued}` },
    );
    return { url: link.url };
  } catch (err) {
    console.warn(`payouts: could not make an onboarding link for ${accountId}: ${describeFailure(err)}`);
    if (failureKind(err) === 'unreachable' || (err as { statusCode?: number }).statusCode! >= 500) {
      throw new PaymentsUnavailable('The payment service is not answering right now, so payout setup cannot continue. Please try again in a few minutes.');
    }
    throw new PaymentsRefused('The payment service refused to start payout setup. Please try again, or contact us if it keeps happening.');
  }
}
