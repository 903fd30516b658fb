// The fake's own plain pages: paying a payment intent, the extra confirmation step, and
// connected-account onboarding. Neutral on purpose; they only stand in for hosted pages.
import { TEST_CARDS } from './cards';

export function escapeHtml(value: unknown): string {
  return String(value ?? '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

const STYLE = `
:root{--ink:#1d2624;--muted:#56625f;--paper:#efeee8;--sheet:#fff;--rule:#b9b6aa;--go:#2b5a4c;--go-ink:#fff;--stop:#8c2f1b;--note:#f6e9c8}
*{box-sizing:border-box}
body{margin:0;background:var(--paper);color:var(--ink);font:16px/1.5 system-ui,-apple-system,"Segoe UI",sans-serif}
.strip{background:var(--ink);color:var(--paper);font:12px/1.4 ui-monospace,Menlo,Consolas,monospace;letter-spacing:.08em;text-transform:uppercase;padding:.4rem 1rem;text-align:center}
main{max-width:30rem;margin:2rem auto;padding:1.5rem;background:var(--sheet);border:2px solid var(--ink)}
h1{font-size:1.05rem;margin:0 0 1rem;letter-spacing:.02em}
.amount{font-size:2rem;font-weight:700;margin:.25rem 0}
.muted{color:var(--muted);font-size:.9rem}
label{display:block;font-weight:600;margin:1rem 0 .25rem}
input{width:100%;font:inherit;padding:.55rem .6rem;border:1px solid var(--rule);border-radius:2px;background:#fff}
input:focus{outline:3px solid var(--note);border-color:var(--ink)}
.row{display:flex;gap:.75rem}.row>div{flex:1}
button{font:inherit;font-weight:600;padding:.65rem 1rem;border:2px solid var(--ink);border-radius:2px;cursor:pointer;margin-top:1.25rem}
button.go{background:var(--go);border-color:var(--go);color:var(--go-ink);width:100%}
button.quiet{background:transparent;color:var(--ink)}
button.stop{background:transparent;color:var(--stop);border-color:var(--stop)}
.alert{background:var(--note);border-left:4px solid var(--stop);padding:.6rem .8rem;margin:1rem 0}
.ok{border-left-color:var(--go)}
table{border-collapse:collapse;width:100%;font-size:.85rem;margin-top:.5rem}
td{border-top:1px solid var(--rule);padding:.3rem .25rem}
code{font-family:ui-monospace,Menlo,Consolas,monospace}
details{margin-top:1.5rem}
a{color:var(--go)}
`;

export function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} · Lacewright test payments</title>
<style>${STYLE}</style>
</head>
<body>
<div class="strip">Lacewright test payments · local test server · no real money moves</div>
<main>
<h1>Lacewright test payments</h1>
${body}
</main>
</body>
</html>`;
}

function testCardTable(): string {
  const rows = TEST_CARDS.map(
    (c) => `<tr><td><code>${c.number.replace(/(\d{4})(?=\d)/g, '$1 ')}</code></td><td>${escapeHtml(c.label)}</td></tr>`,
  ).join('');
  return `<details><summary>Test card numbers</summary>
<p class="muted">Any future expiry date and any three-digit security code work.</p>
<table>${rows}</table></details>`;
}

export interface PaymentPageInput {
  action: string;
  amountText: string;
  description: string | null;
  reference: string;
  returnUrl: string | null;
  error?: string;
  values?: { number?: string; expiry?: string; name?: string };
}

export function paymentPage(input: PaymentPageInput): string {
  const v = input.values ?? {};
  const error = input.error ? `<div class="alert" role="alert">${escapeHtml(input.error)}</div>` : '';
  return layout(
    'Pay',
    `<p class="muted">Amount due</p>
<p class="amount">${escapeHtml(input.amountText)}</p>
${input.description ? `<p>${escapeHtml(input.description)}</p>` : ''}
<p class="muted">Reference <code>${escapeHtml(input.reference)}</code></p>
${error}
<form method="post" action="${escapeHtml(input.action)}" autocomplete="off">
<input type="hidden" name="return_url" value="${escapeHtml(input.returnUrl ?? '')}">
<label for="card_number">Card number</label>
<input id="card_number" name="card_number" inputmode="numeric" autocomplete="cc-number" required value="${escapeHtml(v.number ?? '')}" placeholder="4242 4242 4242 4242">
<div class="row">
<div><label for="expiry">Expiry (MM/YY)</label>
<input id="expiry" name="expiry" autocomplete="cc-exp" required value="${escapeHtml(v.expiry ?? '')}" placeholder="12/34"></div>
<div><label for="cvc">Security code</label>
<input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" required placeholder="123"></div>
</div>
<label for="name">Name on card (optional)</label>
<input id="name" name="name" autocomplete="cc-name" value="${escapeHtml(v.name ?? '')}">
<button class="go" type="submit">Pay ${escapeHtml(input.amountText)}</button>
</form>
${testCardTable()}`,
  );
}

export function authenticatePage(input: { action: string; amountText: string; reference: string; returnUrl: string | null }): string {
  const hidden = `<input type="hidden" name="return_url" value="${escapeHtml(input.returnUrl ?? '')}">`;
  return layout(
    'Confirm payment',
    `<p>The card issuer asks the cardholder to confirm this payment.</p>
<p class="amount">${escapeHtml(input.amountText)}</p>
<p class="muted">Reference <code>${escapeHtml(input.reference)}</code></p>
<form method="post" action="${escapeHtml(input.action)}">${hidden}
<input type="hidden" name="outcome" value="approve">
<button class="go" type="submit">Confirm the payment</button></form>
<form method="post" action="${escapeHtml(input.action)}">${hidden}
<input type="hidden" name="outcome" value="fail">
<button class="stop" type="submit">Refuse (the payment fails)</button></form>`,
  );
}

export function messagePage(title: string, message: string, link?: { href: string; text: string }, ok = false): string {
  return layout(
    title,
    `<div class="alert${ok ? ' ok' : ''}" role="status"><strong>${escapeHtml(title)}</strong><br>${escapeHtml(message)}</div>
${link ? `<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.text)}</a></p>` : ''}`,
  );
}

export function onboardingPage(input: {
  action: string;
  accountId: string;
  email: string | null;
  session: string;
  update: boolean;
}): string {
  const hidden = `<input type="hidden" name="session" value="${escapeHtml(input.session)}">`;
  return layout(
    input.update ? 'Update payout details' : 'Set up payouts',
    `<p>${input.update ? 'Review the payout details for this account.' : 'Set up this account to receive payouts.'}</p>
<p class="muted">Account <code>${escapeHtml(input.accountId)}</code>${input.email ? ` · ${escapeHtml(input.email)}` : ''}</p>
<p class="muted">On this test server nothing needs typing: the button marks identity, bank account and terms as done.</p>
<form method="post" action="${escapeHtml(input.action)}">${hidden}
<input type="hidden" name="choice" value="complete">
<button class="go" type="submit">Complete onboarding</button></form>
<form method="post" action="${escapeHtml(input.action)}">${hidden}
<input type="hidden" name="choice" value="leave">
<button class="quiet" type="submit">Leave without finishing</button></form>`,
  );
}

export function indexPage(): string {
  return layout(
    'Home',
    `<p>This local server stands in for the payments provider during development and tests.</p>
<p class="muted">API under <code>/v1</code>; payment pages under <code>/pay/&lt;payment intent id&gt;</code>; onboarding links under <code>/onboarding/</code>.</p>`,
  );
}
