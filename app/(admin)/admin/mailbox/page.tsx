import { notFound } from 'next/navigation';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { isDemo } from '@/lib/env';
import { listCaughtMail, type CaughtMessage } from '@/lib/mail/mailbox';

export const metadata = { title: 'Demo mailbox' };
export const dynamic = 'force-dynamic';

// Turns bare links in a plain-text mail into clickable ones, without trusting any HTML in it.
function LinkedText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s]+)/g);
  return (
    <pre className="whitespace-pre-wrap break-words font-sans text-sm text-ink-700">
      {parts.map((part, i) =>
        /^https?:\/\//.test(part) ? (
          <a key={i} href={part}>
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </pre>
  );
}

export default async function MailboxPage() {
  await requirePageUser(['admin'], '/admin/mailbox');
  if (!isDemo) notFound();
  let messages: CaughtMessage[] = [];
  let unreachable = false;
  try {
    messages = await listCaughtMail();
  } catch {
    unreachable = true;
  }
  return (
    <>
      <PageHeading title="Demo mailbox" lead="Every e-mail the app sent, as the local mail catcher received it. Newest first." />
      {unreachable && <Notice tone="caution">The local mail catcher is not answering. Is the start command still running?</Notice>}
      {!unreachable && messages.length === 0 && (
        <Card className="text-center text-ink-500">No mail yet. Ask for a sign-in link and it will show up here.</Card>
      )}
      <ul className="space-y-3">
        {messages.map((m) => (
          <li key={m.id}>
            <Card>
              <p className="text-xs text-ink-500">
                {new Date(m.receivedAt).toUTCString()} · to {m.to.join(', ')}
              </p>
              <p className="font-semibold">{m.subject}</p>
              <div className="mt-2">
                <LinkedText text={m.text} />
              </div>
            </Card>
          </li>
        ))}
      </ul>
    </>
  );
}
