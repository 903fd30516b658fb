// A builder's proposed spec change, re-checked by the wheel engine against the request's frame.
import { Invalid } from '@/lib/errors';
import type { RequestRow, StoredProposedChange } from './rows';
import type { ProposedChange } from './schema';
import { applyProposedChange, assessSpec } from './spec';

export function assessProposal(request: Pick<RequestRow, 'spec'>, change: ProposedChange | null | undefined): StoredProposedChange | null {
  if (!change) return null;
  if (change.wheels.length === 0) return { ...change, verdict: null, cautions: [], baselineCents: null };
  const wheels = applyProposedChange(request.spec.wheels, change);
  let assessment;
  try {
    assessment = assessSpec(wheels, request.spec.frame);
  } catch (err) {
    if (!(err instanceof Invalid)) throw err;
    const fieldErrors = Object.fromEntries(Object.entries(err.fieldErrors ?? {}).map(([path, messages]) => [`proposedChange.${path}`, messages]));
    throw new Invalid('The proposed change does not work as described.', fieldErrors);
  }
  if (assessment.verdict === 'does-not-fit') {
    const reasons = assessment.wheels.filter((w) => w.verdict === 'does-not-fit').flatMap((w) => w.reasons);
    throw new Invalid('With the proposed change the wheel would not fit this frame.', { proposedChange: reasons.length ? reasons : ['The engine finds it does not fit.'] });
  }
  return {
    ...change,
    verdict: assessment.verdict,
    cautions: [...new Set(assessment.wheels.flatMap((w) => w.cautions))],
    baselineCents: assessment.baseline.typicalCents,
  };
}
