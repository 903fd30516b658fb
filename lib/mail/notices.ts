// Wording of the market's e-mail notices: one function per notice, each with a link to the page it is about.
import { env } from '@/lib/env';
import type { MailContent } from './transport';
import { escapeHtml, layout } from './templates';

/** Pages the notices link to: the rider's request page and the builder's view of a request. */
export const marketLinks = {
  riderRequest: (requestId: string) => `${env.APP_URL}/requests/${requestId}`,
  builderRequest: (requestId: string) => `${env.APP_URL}/board/${requestId}`,
  shopBids: () => `${env.APP_URL}/bids`,
};

export const formatUsd = (cents: number): string =>
  (cents / 100).toLocaleString('en-US', { style: 'currency', currency: 'USD', minimumFractionDigits: 2 });

function notice(to: string, subject: string, title: string, paragraphs: string[], link: { url: string; label: string }): MailContent {
  const text = `${paragraphs.join('\n\n')}\n\n${link.label}: ${link.url}\n\nLacewright`;
  const html = layout(
    title,
    `${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
<p><a href="${escapeHtml(link.url)}" style="display:inline-block;background:#0f5d5c;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>`,
  );
  return { to, subject, text, html };
}

export function newBidMail(to: string, a: { requestId: string; requestTitle: string; shopName: string; totalCents: number; leadTimeDays: number }): MailContent {
  return notice(
    to,
    `New bid on “${a.requestTitle}”`,
    'A builder bid on your wheel request',
    [`${a.shopName} offers to build “${a.requestTitle}” for ${formatUsd(a.totalCents)}, ready ${a.leadTimeDays} days after you accept.`, 'Compare it with the other bids before you choose.'],
    { url: marketLinks.riderRequest(a.requestId), label: 'Compare bids' },
  );
}

export function bidRevisedMail(to: string, a: { requestId: string; requestTitle: string; shopName: string; totalCents: number; leadTimeDays: number }): MailContent {
  return notice(
    to,
    `A bid on “${a.requestTitle}” changed`,
    'A builder revised their bid',
    [`${a.shopName} revised their bid on “${a.requestTitle}”: now ${formatUsd(a.totalCents)}, ready ${a.leadTimeDays} days after you accept.`],
    { url: marketLinks.riderRequest(a.requestId), label: 'Compare bids' },
  );
}

export function bidAcceptedMail(to: string, a: { requestId: string; requestTitle: string; totalCents: number }): MailContent {
  return notice(
    to,
    `Your bid on “${a.requestTitle}” was accepted`,
    'The rider accepted your bid',
    [`The rider accepted your bid of ${formatUsd(a.totalCents)} for “${a.requestTitle}”.`, 'The rider pays into escrow next; we will tell you when you can start the build.'],
    { url: marketLinks.builderRequest(a.requestId), label: 'Open the request' },
  );
}

export function bidDeclinedMail(to: string, a: { requestId: string; requestTitle: string; reason: 'other-bid' | 'cancelled' }): MailContent {
  const why = a.reason === 'other-bid' ? 'The rider accepted another builder’s bid.' : 'The rider cancelled the request.';
  return notice(
    to,
    `Your bid on “${a.requestTitle}” was declined`,
    'Your bid was not taken',
    [`${why} Your bid on “${a.requestTitle}” is closed.`, 'Thank you for bidding; there are more requests on the board.'],
    { url: marketLinks.shopBids(), label: 'See your bids' },
  );
}

export function newMessageMail(to: string, a: { requestTitle: string; fromName: string; excerpt: string; url: string }): MailContent {
  const excerpt = a.excerpt.length > 280 ? `${a.excerpt.slice(0, 277)}…` : a.excerpt;
  return notice(to, `New message about “${a.requestTitle}”`, 'You have a new message', [`${a.fromName} wrote about “${a.requestTitle}”:`, excerpt], {
    url: a.url,
    label: 'Read and reply',
  });
}

export function requestExpiringMail(to: string, a: { requestId: string; requestTitle: string; expiresAt: Date; liveBidCount: number }): MailContent {
  const when = a.expiresAt.toISOString().slice(0, 16).replace('T', ' ');
  const bids = a.liveBidCount === 0 ? 'It has no bids yet.' : `It has ${a.liveBidCount} ${a.liveBidCount === 1 ? 'bid' : 'bids'} waiting for you.`;
  return notice(
    to,
    `“${a.requestTitle}” closes soon`,
    'Your wheel request is about to expire',
    [`Your request “${a.requestTitle}” closes on ${when} UTC unless you accept a bid before then.`, bids],
    { url: marketLinks.riderRequest(a.requestId), label: 'Open the request' },
  );
}

export function requestExpiredMail(to: string, a: { requestId: string; requestTitle: string }): MailContent {
  return notice(
    to,
    `“${a.requestTitle}” has expired`,
    'Your wheel request expired',
    [`No bid was accepted on “${a.requestTitle}” in time, so it is closed.`, 'Post it again if you still need the wheel.'],
    { url: marketLinks.riderRequest(a.requestId), label: 'Open the request' },
  );
}

export function bidExpiredMail(to: string, a: { requestId: string; requestTitle: string; reason: 'valid-until' | 'request-expired' }): MailContent {
  const why =
    a.reason === 'valid-until'
      ? `Your bid on “${a.requestTitle}” passed its valid-until date without being accepted.`
      : `The request “${a.requestTitle}” closed without an accepted bid.`;
  return notice(to, `Your bid on “${a.requestTitle}” expired`, 'Your bid expired', [why, 'If the request is still open you can bid again.'], {
    url: marketLinks.builderRequest(a.requestId),
    label: 'Open the request',
  });
}

// ------------------------------------------------------------------ money notices (escrow, payouts, disputes)

export const moneyLinks = {
  job: (jobId: string) => `${env.APP_URL}/jobs/${jobId}`,
  payouts: () => `${env.APP_URL}/payouts`,
  adminDispute: (disputeId: string) => `${env.APP_URL}/admin/disputes/${disputeId}`,
};

const day = (d: Date) => d.toISOString().slice(0, 10);

export function paymentReceivedMail(to: string, a: { jobId: string; title: string; priceCents: number; audience: 'rider' | 'builder' }): MailContent {
  return a.audience === 'rider'
    ? notice(
        to,
        `Payment received for “${a.title}”`,
        'Your money is held in escrow',
        [`We received your ${formatUsd(a.priceCents)} for “${a.title}”. It stays in escrow until you confirm you have the wheel.`, 'The builder can start now.'],
        { url: moneyLinks.job(a.jobId), label: 'Open the job' },
      )
    : notice(
        to,
        `Paid: you can start “${a.title}”`,
        'The rider paid into escrow',
        [`The rider paid ${formatUsd(a.priceCents)} for “${a.title}”. It is held in escrow and released to you when the rider confirms receipt.`, 'Mark the build started when you begin.'],
        { url: moneyLinks.job(a.jobId), label: 'Open the job' },
      );
}

export function buildStartedMail(to: string, a: { jobId: string; title: string; shopName: string }): MailContent {
  return notice(to, `${a.shopName} started “${a.title}”`, 'Your build has started', [`${a.shopName} has started building “${a.title}”.`, 'From now on a cancellation by you refunds only part of the price; the job page shows how much.'], {
    url: moneyLinks.job(a.jobId),
    label: 'Open the job',
  });
}

export function jobShippedMail(
  to: string,
  a: { jobId: string; title: string; handover: 'carrier' | 'pickup'; carrier?: string | null; trackingNumber?: string | null; autoConfirmAt: Date },
): MailContent {
  const how =
    a.handover === 'pickup'
      ? `“${a.title}” is ready for pickup at the shop.`
      : `“${a.title}” is on its way with ${a.carrier ?? 'the carrier'}, tracking number ${a.trackingNumber ?? 'not given'}.`;
  return notice(
    to,
    a.handover === 'pickup' ? `“${a.title}” is ready for pickup` : `“${a.title}” has shipped`,
    a.handover === 'pickup' ? 'Your wheel is ready' : 'Your wheel is on its way',
    [how, `When you have it, check it and confirm receipt so the builder is paid. If you do nothing and open no dispute, we confirm for you on ${day(a.autoConfirmAt)} (UTC).`],
    { url: moneyLinks.job(a.jobId), label: 'Open the job' },
  );
}

export function moneyReleasedMail(
  to: string,
  a: { jobId: string; title: string; audience: 'rider' | 'builder'; shareCents: number; feeCents: number; payoutCents: number; automatic: boolean },
): MailContent {
  const when = a.automatic ? 'The waiting period after shipping ended with no dispute, so receipt was confirmed automatically.' : 'The rider confirmed receipt.';
  return a.audience === 'builder'
    ? notice(
        to,
        `Released: ${formatUsd(a.payoutCents)} for “${a.title}”`,
        'Your money is on its way',
        [when, `We are transferring ${formatUsd(a.payoutCents)} to your payout account: ${formatUsd(a.shareCents)} less our referral fee of ${formatUsd(a.feeCents)}.`],
        { url: moneyLinks.job(a.jobId), label: 'Open the job' },
      )
    : notice(to, `“${a.title}” is complete`, 'The job is complete', [when, 'The money in escrow has been released to the builder. Thank you for building with Lacewright.'], {
        url: moneyLinks.job(a.jobId),
        label: 'Open the job',
      });
}

export function refundSentMail(to: string, a: { jobId: string; title: string; refundCents: number }): MailContent {
  return notice(to, `Refund of ${formatUsd(a.refundCents)} for “${a.title}”`, 'Your refund is on its way', [`We sent ${formatUsd(a.refundCents)} back to the card you paid with for “${a.title}”.`, 'Banks usually show a refund within 5 to 10 business days.'], {
    url: moneyLinks.job(a.jobId),
    label: 'Open the job',
  });
}

export function jobCancelledMail(
  to: string,
  a: { jobId: string; title: string; cancelledBy: 'rider' | 'builder'; refundCents: number; payoutCents: number; audience: 'rider' | 'builder' },
): MailContent {
  const who = a.cancelledBy === 'rider' ? 'The rider' : 'The builder';
  const money =
    a.refundCents === 0 && a.payoutCents === 0
      ? 'No money had been paid, so nothing moves.'
      : `${formatUsd(a.refundCents)} goes back to the rider${a.payoutCents > 0 ? ` and ${formatUsd(a.payoutCents)} is paid to the builder for work already done` : ''}.`;
  return notice(to, `“${a.title}” was cancelled`, 'A job was cancelled', [`${who} cancelled “${a.title}”.`, money], { url: moneyLinks.job(a.jobId), label: 'Open the job' });
}

export function disputeOpenedMail(to: string, a: { jobId: string; disputeId: string; title: string; openedBy: 'rider' | 'builder'; reason: string; audience: 'rider' | 'builder' | 'admin' }): MailContent {
  const who = a.openedBy === 'rider' ? 'The rider' : 'The builder';
  return notice(
    to,
    `Dispute opened on “${a.title}”`,
    'A dispute froze the money',
    [`${who} opened a dispute on “${a.title}”: ${a.reason}.`, 'The money stays in escrow until an admin releases it, refunds it or splits it, with a written reason. Add what you know to the dispute.'],
    a.audience === 'admin' ? { url: moneyLinks.adminDispute(a.disputeId), label: 'Review the dispute' } : { url: moneyLinks.job(a.jobId), label: 'Open the job' },
  );
}

export function disputeDecidedMail(to: string, a: { jobId: string; title: string; refundCents: number; payoutCents: number; feeCents: number; reason: string }): MailContent {
  const parts = [
    a.refundCents > 0 ? `${formatUsd(a.refundCents)} goes back to the rider.` : 'Nothing is refunded to the rider.',
    a.payoutCents > 0 ? `${formatUsd(a.payoutCents)} is paid to the builder (after the ${formatUsd(a.feeCents)} referral fee).` : 'Nothing is paid to the builder.',
  ];
  return notice(to, `Dispute decided on “${a.title}”`, 'An admin settled the dispute', [`An admin settled the dispute on “${a.title}”.`, parts.join(' '), `Their reason: ${a.reason}`], {
    url: moneyLinks.job(a.jobId),
    label: 'Open the job',
  });
}

export function payoutSetupNeededMail(to: string, a: { jobId: string; title: string }): MailContent {
  return notice(
    to,
    `Set up payouts so the rider can pay for “${a.title}”`,
    'A rider is waiting to pay you',
    [`The rider wants to pay for “${a.title}”, but your shop has no payout account yet.`, 'Set up payouts (a few minutes) and the rider can pay into escrow straight away.'],
    { url: moneyLinks.payouts(), label: 'Set up payouts' },
  );
}

// ------------------------------------------------------------------ trust and discovery (reviews, invitations)

export function reviewReminderMail(to: string, a: { jobId: string; title: string; counterpart: string; writeUntil: Date }): MailContent {
  return notice(
    to,
    `How did “${a.title}” go?`,
    'Leave a review',
    [
      `“${a.title}” is complete. A few lines and some stars about ${a.counterpart} help other riders and builders decide who to work with.`,
      `Reviews stay hidden from the other side until you have both written one, or until ${day(a.writeUntil)} (UTC), the last day to write.`,
    ],
    { url: moneyLinks.job(a.jobId), label: 'Write your review' },
  );
}

export function bidInvitationMail(
  to: string,
  a: { requestId: string; requestTitle: string; place: string; neededBy: string; reasons: string[]; from: 'match' | 'rider' },
): MailContent {
  const why =
    a.from === 'rider'
      ? `A rider saw your shop page and invites you to bid on “${a.requestTitle}”, from ${a.place}, needed by ${a.neededBy}.`
      : `A new request, “${a.requestTitle}” from ${a.place}, needed by ${a.neededBy}, looks like a good match for your shop.`;
  return notice(to, `Invitation to bid: “${a.requestTitle}”`, 'You are invited to bid', a.reasons.length ? [why, `Why you: ${a.reasons.join('; ')}.`] : [why], {
    url: marketLinks.builderRequest(a.requestId),
    label: 'See the request',
  });
}
