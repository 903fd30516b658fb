'use client';

// A rider picks one of their open requests and invites this shop to bid on it. The shop is e-mailed once
// per request, however often the button is pressed.
import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { fetchJson } from '@/components/market/builder/fetchJson';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { Button } from '@/components/ui/Button';
import { Notice } from '@/components/ui/Notice';
import type { InvitableRequest, InvitationResult } from '@/lib/matching/invitations';
import { invitationInputSchema } from '@/lib/matching/schema';

export interface InviteToBidProps {
  shopSlug: string;
  shopName: string;
  /** The rider's open requests, with what this shop already has of each. */
  requests: InvitableRequest[];
}

export function InviteToBid(props: InviteToBidProps) {
  return (
    <QueryProvider>
      <InviteForm {...props} />
    </QueryProvider>
  );
}

function InviteForm({ shopSlug, shopName, requests }: InviteToBidProps) {
  const selectId = useId();
  const [choices, setChoices] = useState(requests);
  const open = choices.filter((r) => !r.hasBid);
  const [requestId, setRequestId] = useState(() => open.find((r) => !r.invited)?.id ?? open[0]?.id ?? '');
  const invite = useMutation({
    mutationFn: (body: { requestId: string }) => fetchJson<InvitationResult>(`/api/shops/${encodeURIComponent(shopSlug)}/invitations`, { method: 'POST', json: body }),
    onSuccess: (result) => setChoices((list) => list.map((r) => (r.id === result.requestId ? { ...r, invited: true } : r))),
  });

  if (requests.length === 0) return <p className="text-sm text-ink-500">You have no open requests. Ask for a build first, then invite this shop to bid on it.</p>;
  if (open.length === 0) return <p className="text-sm text-ink-500">{shopName} has already bid on each of your open requests.</p>;
  const chosen = choices.find((r) => r.id === requestId);

  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = invitationInputSchema.safeParse({ requestId });
        if (parsed.success) invite.mutate(parsed.data);
      }}
    >
      <div className="space-y-1">
        <label htmlFor={selectId} className="block text-sm font-semibold text-ink-700">
          Your open request
        </label>
        <select
          id={selectId}
          value={requestId}
          onChange={(e) => {
            setRequestId(e.target.value);
            invite.reset();
          }}
          className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base"
        >
          {open.map((r) => (
            <option key={r.id} value={r.id}>
              {r.title}
              {r.invited ? ' (invited)' : ''}
            </option>
          ))}
        </select>
      </div>
      <Button type="submit" disabled={invite.isPending || !requestId}>
        {invite.isPending ? 'Inviting…' : 'Invite to bid'}
      </Button>
      {invite.isSuccess && (
        <Notice tone="success">{invite.data.invitedNow ? `${shopName} has been e-mailed an invitation to bid.` : `${shopName} was already invited to this request; no second e-mail was sent.`}</Notice>
      )}
      {invite.isError && <Notice tone="danger">{invite.error.message}</Notice>}
      {!invite.isSuccess && chosen?.invited && <p className="text-xs text-ink-500">This shop has already been invited to this request.</p>}
    </form>
  );
}
