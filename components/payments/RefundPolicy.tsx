import { REFUND_POLICY } from '@/lib/payments/policy';

/** The cancellation and refund policy, worded once in lib/payments/policy.ts. */
export function RefundPolicy({ compact = false }: { compact?: boolean }) {
  return (
    <section aria-labelledby="refund-policy" className={compact ? '' : 'rounded border border-chalk-200 bg-chalk-50 p-4'}>
      <h3 id="refund-policy" className="text-sm font-semibold text-ink-700">
        {REFUND_POLICY.title}
      </h3>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-ink-700">
        {REFUND_POLICY.points.map((p) => (
          <li key={p}>{p}</li>
        ))}
      </ul>
    </section>
  );
}
