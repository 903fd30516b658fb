import { Badge } from '@/components/ui/Badge';

const TONES: Record<string, 'neutral' | 'petrol' | 'brass' | 'moss' | 'rust' | 'amber'> = {
  awaiting_payment: 'amber',
  funded: 'petrol',
  building: 'petrol',
  shipped: 'brass',
  completed: 'moss',
  cancelled: 'neutral',
  refunded: 'neutral',
  disputed: 'rust',
  resolved: 'moss',
};

/** A job's status, worded by the server, coloured the same everywhere. */
export function JobStatusBadge({ status, label }: { status: string; label: string }) {
  return (
    <span data-testid="job-status" data-status={status}>
      <Badge tone={TONES[status] ?? 'neutral'}>{label}</Badge>
    </span>
  );
}
