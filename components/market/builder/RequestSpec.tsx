// What a builder reads before bidding: the rider's terms, the engine's findings per wheel, and the spec.
import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { VerdictBadge } from '@/components/wheel/FitResultPanel';
import { formatCents } from '@/lib/format';
import type { RequestDetail } from '@/lib/market/getRequestForViewer';
import { HUBS } from '@/lib/wheel';
import { daysBetween, formatDay, lacingText, positionText, REQUEST_STATUS_LABEL, todayIso } from './display';

const hubLabel = (id: string): string => HUBS.find((h) => h.id === id)?.label ?? id;
const mm = (value: number) => `${Number(value.toFixed(1))} mm`;

function Fact({ label, children, testId }: { label: string; children: React.ReactNode; testId?: string }) {
  return (
    <div className="min-w-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-500 uppercase">{label}</dt>
      <dd className="mt-0.5 text-ink-900" data-testid={testId}>
        {children}
      </dd>
    </div>
  );
}

export function RiderTerms({ request, distanceMiles, matchesCapabilities }: { request: RequestDetail; distanceMiles: number | null; matchesCapabilities: boolean | null }) {
  const daysLeft = daysBetween(todayIso(), request.neededBy);
  return (
    <Card>
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="mr-auto text-xl font-bold">The rider asks for</h2>
        <Badge tone={request.status === 'open' ? 'petrol' : 'neutral'}>{REQUEST_STATUS_LABEL[request.status]}</Badge>
        {matchesCapabilities === false && <Badge tone="amber">Outside your listed capabilities</Badge>}
      </div>
      <dl className="mt-4 grid gap-4 sm:grid-cols-3">
        <Fact label="Needed by" testId="needed-by">
          {formatDay(request.neededBy)}
          <span className="block text-xs text-ink-500">{daysLeft >= 0 ? `${daysLeft} days from today` : `${-daysLeft} days ago`}</span>
        </Fact>
        <Fact label="Budget" testId="budget">
          {formatCents(request.budgetCents, { whole: true })}
          <span className="block text-xs text-ink-500">
            Baseline {formatCents(request.baseline.lowCents, { whole: true })} to {formatCents(request.baseline.highCents, { whole: true })}
          </span>
        </Fact>
        <Fact label="Distance" testId="distance">
          {distanceMiles === null ? '—' : `${distanceMiles.toLocaleString('en-US')} mi from your shop`}
          <span className="block text-xs text-ink-500">
            {request.city}, {request.region} · {request.delivery === 'ship' ? 'ship to the rider' : 'local pickup'}
          </span>
        </Fact>
        <Fact label="Bids so far">{request.liveBidCount === 1 ? '1 live bid' : `${request.liveBidCount} live bids`}</Fact>
        <Fact label="Published">{request.publishedAt ? formatDay(request.publishedAt) : '—'}</Fact>
        <Fact label="Closes">{request.expiresAt ? formatDay(request.expiresAt) : '—'}</Fact>
      </dl>
      {request.notes && (
        <div className="mt-4 rounded border border-chalk-200 bg-chalk-50 px-4 py-3">
          <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Notes from the rider</p>
          <p className="mt-1 whitespace-pre-wrap">{request.notes}</p>
        </div>
      )}
    </Card>
  );
}

export function FitSummary({ request }: { request: RequestDetail }) {
  return (
    <Card>
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="mr-auto text-xl font-bold">Fit check</h2>
        <VerdictBadge verdict={request.fitVerdict} />
      </div>
      <p className="mt-1 text-sm text-ink-500">The wheel engine&rsquo;s reading of this spec against the rider&rsquo;s frame, worked out from typical part dimensions.</p>
      <div className="mt-4 space-y-4">
        {request.fit.map((w) => (
          <div key={w.position} className="rounded border border-chalk-200 p-4" data-testid={`fit-${w.position}`}>
            <div className="flex flex-wrap items-center gap-2">
              <h3 className="mr-auto font-bold">{positionText(w.position)} wheel</h3>
              <VerdictBadge verdict={w.verdict} />
            </div>
            <dl className="mt-3 grid gap-3 text-sm sm:grid-cols-3">
              <Fact label="Spoke length, left">{mm(w.spokeLengthsMm.left)}</Fact>
              <Fact label="Spoke length, right">{mm(w.spokeLengthsMm.right)}</Fact>
              <Fact label="Baseline cost">{formatCents(w.baseline.typicalCents, { whole: true })}</Fact>
            </dl>
            {w.reasons.length > 0 && (
              <div className="mt-3">
                <p className="text-sm font-semibold text-ink-700">How the engine reads it</p>
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-700">
                  {w.reasons.map((r) => (
                    <li key={r}>{r}</li>
                  ))}
                </ul>
              </div>
            )}
            {w.changes.length > 0 && (
              <div className="mt-3">
                <p className="text-sm font-semibold text-amber-700">Changes it needs</p>
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
                  {w.changes.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              </div>
            )}
            {w.cautions.length > 0 && (
              <div className="mt-3">
                <p className="text-sm font-semibold text-ink-700">Cautions</p>
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-700">
                  {w.cautions.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        ))}
      </div>
    </Card>
  );
}

export function SpecSheet({ request }: { request: RequestDetail }) {
  const { frame } = request;
  return (
    <Card>
      <h2 className="text-xl font-bold">Spec</h2>
      <div className="mt-3 overflow-x-auto">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">The wheels the rider asks for</caption>
          <thead className="text-xs tracking-wide text-ink-500 uppercase">
            <tr>
              <th scope="col" className="py-1 pr-3 font-semibold">
                &nbsp;
              </th>
              {request.wheels.map((w) => (
                <th key={w.position} scope="col" className="py-1 pr-3 font-semibold">
                  {positionText(w.position)} wheel
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {(
              [
                ['Size', (w) => `${w.nominalDiameterIn} inch`],
                ['Rim width', (w) => mm(w.rimWidthMm)],
                ['Tire width', (w) => mm(w.tireWidthMm)],
                ['Spokes', (w) => `${w.spokes}`],
                ['Spoke gauge', (w) => `${w.spokeGauge} g`],
                ['Lacing', (w) => lacingText(w.lacing)],
                ['Hub', (w) => hubLabel(w.hubId)],
                ['Finish', (w) => w.finish],
              ] as const satisfies readonly (readonly [string, (w: RequestDetail['wheels'][number]) => string])[]
            ).map(([label, value]) => (
              <tr key={label} className="border-t border-chalk-200">
                <th scope="row" className="py-1.5 pr-3 font-semibold text-ink-700">
                  {label}
                </th>
                {request.wheels.map((w) => (
                  <td key={w.position} className="py-1.5 pr-3">
                    {value(w)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <h3 className="mt-5 font-bold">Frame</h3>
      <dl className="mt-2 grid gap-3 text-sm sm:grid-cols-2">
        <Fact label="Rear spacing">{mm(frame.rearSpacingMm)}</Fact>
        <Fact label="Fork spacing">{mm(frame.frontSpacingMm)}</Fact>
        <Fact label="Bottom-bracket shell">
          {mm(frame.bbShellWidthMm)}, {frame.bbShellType}
        </Fact>
        <Fact label="Chainstay">{frame.chainstayLengthMm !== undefined ? mm(frame.chainstayLengthMm) : 'not given'}</Fact>
      </dl>
    </Card>
  );
}
