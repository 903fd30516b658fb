'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/Button';
import { SelectField } from '@/components/ui/Field';
import { DISPUTE_REASONS, disputeInputSchema, type DisputeInput, type DisputeReason } from '@/lib/payments/schema';

/** Opening a dispute: what went wrong and what happened, for the admin who decides. */
export function DisputeForm({ busy, onSubmit, onCancel }: { busy: boolean; onSubmit: (input: DisputeInput) => void; onCancel: () => void }) {
  const [reason, setReason] = useState<DisputeReason | ''>('');
  const [details, setDetails] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  return (
    <form
      className="space-y-3"
      aria-label="Open a dispute"
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = disputeInputSchema.safeParse({ reason, details });
        if (!parsed.success) {
          const fe: Record<string, string> = {};
          for (const issue of parsed.error.issues) fe[String(issue.path[0])] ??= issue.message;
          setErrors(fe);
          return;
        }
        setErrors({});
        onSubmit(parsed.data);
      }}
    >
      <p className="text-sm text-ink-700">
        A dispute freezes the money in escrow: nobody is paid or refunded until an admin has read both sides and decided. Try talking it through with the other side first.
      </p>
      <SelectField label="What went wrong?" value={reason} onChange={(e) => setReason(e.target.value as DisputeReason)} error={errors.reason}>
        <option value="">Choose one</option>
        {Object.entries(DISPUTE_REASONS).map(([value, label]) => (
          <option key={value} value={value}>
            {label}
          </option>
        ))}
      </SelectField>
      <div className="space-y-1">
        <label htmlFor="dispute-details" className="block text-sm font-semibold text-ink-700">
          What happened
        </label>
        <textarea
          id="dispute-details"
          rows={5}
          value={details}
          onChange={(e) => setDetails(e.target.value)}
          aria-invalid={errors.details ? true : undefined}
          className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500 aria-[invalid=true]:border-rust-500"
        />
        {errors.details && (
          <p role="alert" className="text-xs font-semibold text-rust-700">
            {errors.details}
          </p>
        )}
      </div>
      <div className="flex gap-2">
        <Button type="submit" tone="danger" disabled={busy}>
          Open the dispute
        </Button>
        <Button type="button" tone="quiet" onClick={onCancel}>
          Not now
        </Button>
      </div>
    </form>
  );
}
