import { Badge } from '@/components/ui/Badge';

const REQUEST: Record<string, { tone: 'neutral' | 'petrol' | 'brass' | 'moss' | 'rust' | 'amber'; label: string }> = {
  draft: { tone: 'neutral', label: 'Draft' },
  open: { tone: 'petrol', label: 'Open for bids' },
  awarded: { tone: 'moss', label: 'Bid accepted' },
  cancelled: { tone: 'rust', label: 'Cancelled' },
  expired: { tone: 'amber', label: 'Expired' },
  live: { tone: 'petrol', label: 'Live' },
  accepted: { tone: 'moss', label: 'Accepted' },
  declined: { tone: 'neutral', label: 'Declined' },
  withdrawn: { tone: 'neutral', label: 'Withdrawn' },
};

/** One badge for request and bid states, so both read the same everywhere. */
export function StatusBadge({ status }: { status: string }) {
  const s = REQUEST[status] ?? { tone: 'neutral' as const, label: status };
  return (
    <span data-testid="status" data-status={status}>
      <Badge tone={s.tone}>{s.label}</Badge>
    </span>
  );
}
