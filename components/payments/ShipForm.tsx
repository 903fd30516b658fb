'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/Button';
import { TextField } from '@/components/ui/Field';
import { shipInputSchema, type ShipInput } from '@/lib/payments/schema';

/** The builder hands the wheel over: by carrier with a tracking number, or ready for pickup at the shop. */
export function ShipForm({ pickupRequested, busy, onSubmit, serverErrors }: { pickupRequested: boolean; busy: boolean; onSubmit: (input: ShipInput) => void; serverErrors?: Record<string, string[]> }) {
  const [handover, setHandover] = useState<'carrier' | 'pickup'>(pickupRequested ? 'pickup' : 'carrier');
  const [carrier, setCarrier] = useState('');
  const [trackingNumber, setTrackingNumber] = useState('');
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const shown = { ...serverErrors, ...errors };
  return (
    <form
      className="space-y-3"
      aria-label="Hand the wheel over"
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = shipInputSchema.safeParse(handover === 'pickup' ? { handover } : { handover, carrier, trackingNumber });
        if (!parsed.success) {
          const fe: Record<string, string[]> = {};
          for (const issue of parsed.error.issues) (fe[String(issue.path[0])] ??= []).push(issue.message);
          setErrors(fe);
          return;
        }
        setErrors({});
        onSubmit(parsed.data);
      }}
    >
      <fieldset className="space-y-1">
        <legend className="text-sm font-semibold text-ink-700">How does the rider get the wheel?</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="handover" value="carrier" checked={handover === 'carrier'} onChange={() => setHandover('carrier')} /> Shipped by a carrier
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="handover" value="pickup" checked={handover === 'pickup'} onChange={() => setHandover('pickup')} /> Ready for pickup at the shop
        </label>
      </fieldset>
      {handover === 'carrier' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Carrier" value={carrier} onChange={(e) => setCarrier(e.target.value)} error={shown.carrier?.[0]} autoComplete="off" />
          <TextField label="Tracking number" value={trackingNumber} onChange={(e) => setTrackingNumber(e.target.value)} error={shown.trackingNumber?.[0]} autoComplete="off" />
        </div>
      )}
      <Button type="submit" disabled={busy}>
        {handover === 'pickup' ? 'Mark ready for pickup' : 'Mark shipped'}
      </Button>
    </form>
  );
}
