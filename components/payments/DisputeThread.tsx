'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/Button';
import type { DisputeView } from '@/lib/payments/disputes';
import { formatWhen } from './api';

const WHO: Record<string, string> = { rider: 'Rider', builder: 'Builder', admin: 'Admin' };

/** The dispute as both sides and the admin see it: the opening statement, the thread, and a box to add to it. */
export function DisputeThread({ dispute, busy, onAdd }: { dispute: DisputeView; busy: boolean; onAdd?: (body: string) => void }) {
  const [body, setBody] = useState('');
  return (
    <div className="space-y-3" data-testid="dispute">
      <div className="rounded border border-chalk-200 bg-chalk-50 p-3">
        <p className="text-xs text-ink-500">
          Opened by the {dispute.openedByRole} · {formatWhen(dispute.openedAt)}
        </p>
        <p className="font-semibold">{dispute.reasonLabel}</p>
        <p className="whitespace-pre-wrap text-sm text-ink-700">{dispute.details}</p>
      </div>
      {dispute.notes.length > 0 && (
        <ol className="space-y-2">
          {dispute.notes.map((n) => (
            <li key={n.id} className="rounded border border-chalk-200 p-3">
              <p className="text-xs text-ink-500">
                {WHO[n.authorRole] ?? n.authorRole}
                {n.authorName ? ` · ${n.authorName}` : ''} · {formatWhen(n.at)}
              </p>
              <p className="whitespace-pre-wrap text-sm">{n.body}</p>
            </li>
          ))}
        </ol>
      )}
      {dispute.status === 'resolved' && (
        <div className="rounded border-l-4 border-moss-500 bg-moss-50 p-3 text-sm text-moss-700" data-testid="dispute-decision">
          <p className="font-semibold">Decided: {dispute.resolution === 'release' ? 'released to the builder' : dispute.resolution === 'refund' ? 'refunded to the rider' : 'split between both'}</p>
          <p className="whitespace-pre-wrap">{dispute.resolutionReason}</p>
        </div>
      )}
      {dispute.status === 'open' && onAdd && (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (body.trim().length < 2) return;
            onAdd(body.trim());
            setBody('');
          }}
        >
          <label htmlFor="dispute-note" className="block text-sm font-semibold text-ink-700">
            Add to the dispute
          </label>
          <textarea
            id="dispute-note"
            rows={3}
            value={body}
            onChange={(e) => setBody(e.target.value)}
            className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500"
          />
          <Button type="submit" tone="secondary" disabled={busy || body.trim().length < 2}>
            Add
          </Button>
        </form>
      )}
    </div>
  );
}
