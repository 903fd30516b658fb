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
