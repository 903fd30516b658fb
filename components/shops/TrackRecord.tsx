import type { LeadTimeSummary } from '@/lib/shops/profile';

const days = (n: number) => `${Math.round(n)} ${Math.round(n) === 1 ? 'day' : 'days'}`;

/** Completed builds and the typical lead time: paid into escrow to shipped, against what the shop promised. */
export function TrackRecord({ completedBuilds, leadTime }: { completedBuilds: number; leadTime: LeadTimeSummary }) {
  return (
    <dl className="space-y-3 text-sm" data-testid="track-record">
      <div>
        <dt className="text-ink-500">Completed builds on Lacewright</dt>
        <dd className="text-lg font-semibold text-ink-900">{completedBuilds}</dd>
      </div>
      <div>
        <dt className="text-ink-500">Typical lead time</dt>
        {leadTime.medianActualDays === null ? (
          <dd className="text-ink-700">Not enough completed builds to tell yet.</dd>
        ) : (
          <dd data-testid="lead-time">
            <span className="text-lg font-semibold text-ink-900">{days(leadTime.medianActualDays)}</span>
            <span className="text-ink-700"> from payment to shipping (median)</span>
            <span className="block text-ink-500">
              Promised {days(leadTime.medianPromisedDays!)} (median); {leadTime.onTime} of {leadTime.builds} shipped on time ({Math.round((leadTime.onTimeShare ?? 0) * 100)} %).
            </span>
          </dd>
        )}
      </div>
    </dl>
  );
}
