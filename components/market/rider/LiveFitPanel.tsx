'use client';

import { useDebounced } from '@/components/hooks/useDebounced';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { VerdictBadge } from '@/components/wheel/FitResultPanel';
import { formatCents } from '@/lib/format';
import type { FrameSpec, WheelSpec } from '@/lib/market/schema';
import { toFitInput } from '@/lib/market/spec';
import type { FitResult } from '@/lib/wheel';

type Answer = { ok: true; result: FitResult } | { ok: false; messages: string[] };

async function fitWheel(wheel: WheelSpec, frame: FrameSpec): Promise<Answer> {
  const res = await fetch('/api/fit', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(toFitInput(wheel, frame)) });
  const body = await res.json();
  if (res.ok) return { ok: true, result: body };
  if (res.status === 400) return { ok: false, messages: Object.values((body.fieldErrors ?? {}) as Record<string, string[]>).map((m) => m[0]) };
  throw new Error(body.error ?? 'The fit check is not answering.');
}


/** The engine's answer for each wheel as the rider fills the form. */
export function LiveFitPanel({ wheels, frame }: { wheels: WheelSpec[]; frame: FrameSpec }) {
  const input = useDebounced({ wheels, frame }, 350);
  const query = useQuery({
    queryKey: ['request-fit', input],
    queryFn: () => Promise.all(input.wheels.map((w) => fitWheel(w, input.frame))),
    placeholderData: keepPreviousData,
  });
  const answers = query.data ?? [];
  const baseline = answers.reduce((sum, a) => sum + (a.ok ? a.result.cost.typicalCents : 0), 0);
  return (
    <div className="space-y-3" aria-live="polite" data-testid="live-fit">
      {query.isError && <Notice tone="danger">The fit check is not answering right now; your form is kept. Try again in a moment.</Notice>}
      {answers.map((a, i) => (
        <Card key={i}>
          <div className="flex items-center justify-between">
            <h3 className="font-bold">{wheels[i]?.position === 'front' ? 'Front wheel' : 'Rear wheel'}</h3>
            {a.ok && <VerdictBadge verdict={a.result.verdict} />}
          </div>
          {!a.ok && (
            <ul className="mt-2 list-disc pl-5 text-sm text-rust-700">
              {a.messages.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          )}
          {a.ok && (
            <div className="mt-2 space-y-2 text-sm">
              <ul className="list-disc space-y-0.5 pl-5 text-ink-700">
                {[...a.result.changes, ...a.result.reasons.slice(0, 2)].map((r) => (
                  <li key={r}>{r}</li>
                ))}
              </ul>
              <p>
                Spokes: <strong>{a.result.spokes.leftMm} mm</strong> left, <strong>{a.result.spokes.rightMm} mm</strong> right
              </p>
              <p>
                Baseline: {formatCents(a.result.cost.lowCents, { whole: true })} to {formatCents(a.result.cost.highCents, { whole: true })}, typically{' '}
                <strong>{formatCents(a.result.cost.typicalCents, { whole: true })}</strong>
              </p>
              {a.result.cautions.length > 1 && (
                <details className="text-xs text-amber-700">
                  <summary className="cursor-pointer font-semibold">Cautions ({a.result.cautions.length})</summary>
                  <ul className="mt-1 list-disc space-y-0.5 pl-5">
                    {a.result.cautions.map((c) => (
                      <li key={c}>{c}</li>
                    ))}
                  </ul>
                </details>
              )}
            </div>
          )}
        </Card>
      ))}
      {answers.length > 0 && answers.every((a) => a.ok) && (
        <p className="text-sm text-ink-500">
          Baseline for the whole request: <strong className="text-ink-900">{formatCents(baseline, { whole: true })}</strong> (demo price book, an estimate).
        </p>
      )}
      {query.isPending && <p className="text-sm text-ink-500">Working out the fit…</p>}
    </div>
  );
}
