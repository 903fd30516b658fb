// The columns a request's spec fills in: location from the ZIP, the engine's verdict and baseline, board copies.
import { Invalid } from '@/lib/errors';
import { lookupZip } from '@/lib/geo/zip';
import type { RequestInput } from './schema';
import { assessSpec, boardColumns } from './spec';

export function requestRecord(input: RequestInput) {
  const place = lookupZip(input.zip);
  if (!place) throw new Invalid('Check the location.', { zip: ['We could not find that ZIP code.'] });
  const assessment = assessSpec(input.wheels, input.frame);
  return {
    title: input.title,
    spec: JSON.stringify({ wheels: input.wheels, frame: input.frame }),
    ...boardColumns(input.wheels),
    zip: place.zip,
    city: place.city,
    region: place.region,
    latitude: place.latitude,
    longitude: place.longitude,
    delivery: input.delivery,
    needed_by: input.neededBy,
    budget_cents: input.budgetCents,
    notes: input.notes,
    fit_verdict: assessment.verdict,
    baseline_low_cents: assessment.baseline.lowCents,
    baseline_cents: assessment.baseline.typicalCents,
    baseline_high_cents: assessment.baseline.highCents,
  };
}
