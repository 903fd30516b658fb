'use client';

// One conversation between a request's rider and one shop: the messages, oldest first, and a composer.
// It polls every ten seconds; messages that arrived unread stay flagged "New" while the page is open.
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Badge } from '@/components/ui/Badge';
import { Button } from '@/components/ui/Button';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import type { MessageView, ThreadView } from '@/lib/market/messages';
import { messageInputSchema } from '@/lib/market/schema';
import { ApiError, fetchJson } from './builder/fetchJson';

export interface MessageThreadProps {
  requestId: string;
  shopId: string;
  /** Whose page this is: labels the viewer's own side "You" / "Your shop". Admins read only. */
  viewerSide: 'rider' | 'shop' | 'admin';
  /** Heading over the thread; defaults to "Messages". */
  title?: string;
  /** How often to look for new messages, in milliseconds. */
  pollMs?: number;
  /** An id for the section, so other pages can link straight to the thread. */
  id?: string;
}

type MessageValues = z.input<typeof messageInputSchema>;

export const threadKey = (requestId: string, shopId: string) => ['thread', requestId, shopId] as const;

const when = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });

function sideLabel(message: MessageView, viewerSide: MessageThreadProps['viewerSide'], shopName: string): string {
  if (message.authorSide === 'admin') return `${message.authorName} (Lacewright)`;
  if (message.authorSide === viewerSide) return viewerSide === 'shop' ? `${message.authorName}, your shop` : 'You';
  return message.authorSide === 'shop' ? `${message.authorName}, ${shopName}` : `${message.authorName} (rider)`;
}

export function MessageThread({ requestId, shopId, viewerSide, title = 'Messages', pollMs = 10_000, id }: MessageThreadProps) {
  const client = useQueryClient();
  const key = threadKey(requestId, shopId);
  const url = `/api/requests/${requestId}/threads/${shopId}/messages`;
  const headingId = useId();
  const listRef = useRef<HTMLOListElement>(null);
  const [failure, setFailure] = useState<string | null>(null);

  const thread = useQuery({
    queryKey: key,
    queryFn: async ({ signal }) => {
      const fresh = await fetchJson<ThreadView>(url, { signal });
      // Reading marks the thread read on the server, so keep the flag on what was new when it arrived.
      const before = client.getQueryData<ThreadView>(key);
      const wasNew = new Set(before?.messages.filter((m) => m.isNew).map((m) => m.id));
      return { ...fresh, messages: fresh.messages.map((m) => ({ ...m, isNew: m.isNew || wasNew.has(m.id) })) };
    },
    refetchInterval: pollMs,
    refetchIntervalInBackground: false,
    retry: (count, err) => !(err instanceof ApiError && err.status >= 400 && err.status < 500) && count < 2,
  });

  const form = useForm<MessageValues>({ resolver: zodResolver(messageInputSchema), defaultValues: { body: '' } });
  const send = useMutation({
    mutationFn: (values: MessageValues) => fetchJson<MessageView>(url, { method: 'POST', json: values }),
    onSuccess: (message) => {
      client.setQueryData<ThreadView>(key, (old) => (old ? { ...old, messages: [...old.messages, message] } : old));
      return client.invalidateQueries({ queryKey: key });
    },
  });

  const onSubmit = form.handleSubmit(async (values) => {
    setFailure(null);
    try {
      await send.mutateAsync(values);
      form.reset({ body: '' });
    } catch (err) {
      // What was typed stays in the box.
      const apiError = err instanceof ApiError ? err : null;
      const fieldMessage = apiError?.fieldErrors.body?.[0];
      if (fieldMessage) form.setError('body', { type: 'server', message: fieldMessage });
      else setFailure(apiError?.message ?? 'The message was not sent. Try again.');
    }
  });

  const messages = thread.data?.messages ?? [];
  const newCount = messages.filter((m) => m.isNew).length;
  const lastId = messages[messages.length - 1]?.id;
  useEffect(() => {
    const list = listRef.current;
    if (list) list.scrollTop = list.scrollHeight;
  }, [lastId]);

  const bodyError = form.formState.errors.body?.message;
  const canPost = thread.data?.canPost === true && viewerSide !== 'admin';

  return (
    <section id={id} aria-labelledby={headingId} className="scroll-mt-4 rounded-lg border border-chalk-200 bg-white shadow-card" data-testid="message-thread">
      <div className="flex flex-wrap items-center justify-between gap-2 border-b border-chalk-200 px-5 py-3">
        <h2 id={headingId} className="text-xl font-bold">
          {title}
        </h2>
        <div aria-live="polite" className="flex items-center gap-2">
          {newCount > 0 && <Badge tone="brass">{newCount === 1 ? '1 new message' : `${newCount} new messages`}</Badge>}
          {thread.isFetching && !thread.isPending && <span className="text-xs text-ink-500">Checking for messages…</span>}
        </div>
      </div>

      <div className="px-5 py-4">
        {thread.isPending && <Spinner label="Loading the conversation…" />}
        {thread.isError && (
          <Notice tone="danger" title="The conversation did not load">
            {thread.error.message}{' '}
            <button type="button" className="font-semibold underline" onClick={() => thread.refetch()}>
              Try again
            </button>
          </Notice>
        )}
        {thread.isSuccess && messages.length === 0 && (
          <p className="py-6 text-center text-ink-500" data-testid="thread-empty">
            No messages yet. Questions about parts, spacing or timing go here; only the rider, this shop and Lacewright admins can read them.
          </p>
        )}
        {messages.length > 0 && (
          <ol ref={listRef} className="max-h-[28rem] space-y-3 overflow-y-auto pr-1" aria-label="Messages, oldest first">
            {messages.map((m) => {
              const own = m.authorSide === viewerSide;
              return (
                <li
                  key={m.id}
                  data-testid="message"
                  data-new={m.isNew || undefined}
                  className={`max-w-[85%] rounded-lg border px-4 py-2 ${own ? 'ml-auto border-petrol-100 bg-petrol-50' : 'border-chalk-200 bg-chalk-50'} ${m.isNew ? 'border-l-4 border-l-brass-500' : ''}`}
                >
                  <div className="flex flex-wrap items-center gap-2 text-xs text-ink-500">
                    <span className="font-semibold text-ink-700">{sideLabel(m, viewerSide, thread.data?.shopName ?? 'the shop')}</span>
                    <time dateTime={m.createdAt}>{when.format(new Date(m.createdAt))}</time>
                    {m.isNew && <Badge tone="brass">New</Badge>}
                  </div>
                  <p className="mt-1 whitespace-pre-wrap break-words text-ink-900">{m.body}</p>
                </li>
              );
            })}
          </ol>
        )}
      </div>

      {thread.isSuccess && !canPost && viewerSide !== 'admin' && (
        <div className="border-t border-chalk-200 px-5 py-3">
          <p className="text-sm text-ink-500">This conversation takes no new messages.</p>
        </div>
      )}
      {canPost && (
        <form onSubmit={onSubmit} noValidate className="space-y-2 border-t border-chalk-200 px-5 py-4" aria-label="Write a message">
          {failure && <Notice tone="danger">{failure}</Notice>}
          <label htmlFor={`${headingId}-body`} className="block text-sm font-semibold text-ink-700">
            Your message
          </label>
          <textarea
            id={`${headingId}-body`}
            rows={3}
            aria-invalid={bodyError ? true : undefined}
            aria-describedby={bodyError ? `${headingId}-body-error` : undefined}
            className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 placeholder:text-ink-300 focus:border-petrol-500 aria-[invalid=true]:border-rust-500"
            {...form.register('body')}
          />
          {bodyError && (
            <p id={`${headingId}-body-error`} role="alert" className="text-xs font-semibold text-rust-700">
              {bodyError}
            </p>
          )}
          <div className="flex justify-end">
            <Button type="submit" disabled={form.formState.isSubmitting}>
              {form.formState.isSubmitting ? 'Sending…' : 'Send message'}
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
