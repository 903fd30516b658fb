// E-mail wording lives here, one function per message, so every notice reads the same way.
import type { MailContent } from './transport';

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function layout(title: string, bodyHtml: string): string {
  return `<!doctype html><html><body style="font-family:sans-serif;background:#fbf8f3;color:#1b2230;padding:24px">
<div style="max-width:520px;margin:auto;background:#fff;border:1px solid #e8e0d2;border-radius:10px;padding:24px">
<p style="font-weight:700;color:#0f5d5c;letter-spacing:.04em">LACEWRIGHT</p>
<h1 style="font-size:20px">${escapeHtml(title)}</h1>${bodyHtml}</div></body></html>`;
}

export function signInLinkMail(to: string, url: string): MailContent {
  return {
    to,
    subject: 'Your Lacewright sign-in link',
    text: `Use this link to sign in to Lacewright:\n\n${url}\n\nIt works once and expires in 24 hours. If you did not ask for it, ignore this message.`,
    html: layout(
      'Sign in to Lacewright',
      `<p>Use this button to sign in. It works once and expires in 24 hours.</p>
<p><a href="${escapeHtml(url)}" style="display:inline-block;background:#0f5d5c;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Sign in</a></p>
<p style="color:#5a6474;font-size:13px">If you did not ask for this link, ignore this message.</p>`,
    ),
  };
}
