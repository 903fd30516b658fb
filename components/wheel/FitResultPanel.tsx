import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { formatCents, formatGrams, formatLength, type LengthUnit } from '@/lib/format';
import type { FitResult } from '@/lib/wheel';
import { CostChart } from './CostChart';
import { LacingDiagram } from './LacingDiagram';
import { TopViewDiagram } from './TopViewDiagram';

const VERDICT = {
  fits: { tone: 'moss', label: 'Fits' },
  'fits-with-changes': { tone: 'amber', label: 'Fits with changes' },
  'does-not-fit': { tone: 'rust', label: 'Does not fit' },
} as const;

export function VerdictBadge({ verdict }: { verdict: FitResult['verdict'] }) {
  const v = VERDICT[verdict];
  return (
    <span data-testid="verdict" data-verdict={verdict}>
      <Badge tone={v.tone}>{v.label}</Badge>
    </span>
  );
}

export function FitResultPanel({ result, unit }: { result: FitResult; unit: LengthUnit }) {
  const { fitment, spokes, cost, mass, dimensions, gearing, geometry } = result;
  return (
    <div className="space-y-4">
      <Card>
        <div className="flex items-center justify-between gap-3">
          <h2 className="text-xl font-bold">Fit</h2>
          <VerdictBadge verdict={result.verdict} />
        </div>
        <ul className="mt-3 list-disc space-y-1 pl-5 text-sm text-ink-700">
          {result.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
        {result.changes.length > 0 && (
          <div className="mt-3">
            <p className="text-sm font-semibold">What to change</p>
            <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-700">
              {result.changes.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          </div>
        )}
        <dl className="mt-4 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-500">Hub</dt>
          <dd>{fitment.needs.hubClass}{fitment.needs.oldMm ? `, ${fitment.needs.oldMm} mm OLD` : ''}</dd>
          {fitment.position === 'rear' && (
            <>
              <dt className="text-ink-500">Cog</dt>
              <dd>{fitment.needs.cog === 'offset' ? 'Offset (dished) cog' : 'Standard flat cog'}</dd>
              <dt className="text-ink-500">Chain to tire</dt>
              <dd>{fitment.chainToTireClearanceMm === null ? '—' : formatLength(fitment.chainToTireClearanceMm, unit)}</dd>
              <dt className="text-ink-500">Bottom-bracket shell</dt>
              <dd>{fitment.needs.bbShellWidthMm ?? '—'} mm</dd>
              <dt className="text-ink-500">Spindle</dt>
              <dd>{fitment.needs.spindleLengthMm ?? '—'} mm</dd>
            </>
          )}
          {fitment.position === 'front' && (
            <>
              <dt className="text-ink-500">Front hub width</dt>
              <dd>{fitment.needs.frontHubOldMm ?? '—'} mm</dd>
              <dt className="text-ink-500">Tire to fork blade</dt>
              <dd>{fitment.forkBladeClearanceMm === null ? '—' : formatLength(fitment.forkBladeClearanceMm, unit)}</dd>
            </>
          )}
        </dl>
      </Card>

      {result.cautions.length > 0 && (
        <Notice tone="caution" title="Before anyone rides this">
          <ul className="list-disc space-y-1 pl-5" data-testid="cautions">
            {result.cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </Notice>
      )}

      <Card>
        <h2 className="text-xl font-bold">Spokes</h2>
        {!result.lacing.ok && <Notice tone="danger">{result.lacing.reason}</Notice>}
        <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm" data-testid="spoke-lengths">
          <dt className="text-ink-500">Left (non-drive) length</dt>
          <dd className="font-semibold tabular-nums">{formatLength(spokes.leftMm, unit, 0)}</dd>
          <dt className="text-ink-500">Right (drive) length</dt>
          <dd className="font-semibold tabular-nums">{formatLength(spokes.rightMm, unit, 0)}</dd>
          <dt className="text-ink-500">Dish</dt>
          <dd className="tabular-nums">{formatLength(spokes.dishMm, unit)}</dd>
          <dt className="text-ink-500">Count, gauge</dt>
          <dd>
            {spokes.count} spokes, {spokes.gauge} gauge ({spokes.wireDiameterMm} mm)
          </dd>
          <dt className="text-ink-500">ERD</dt>
          <dd>
            {dimensions.erdMm} mm {dimensions.erdMeasured ? '(measured)' : '(estimated from the bead seat; measure your rim)'}
          </dd>
          <dt className="text-ink-500">Bead seat (ISO 5775)</dt>
          <dd>{dimensions.bsdMm} mm</dd>
          <dt className="text-ink-500">Tire outer diameter</dt>
          <dd>{formatLength(dimensions.tireOuterDiameterMm, unit, 0)}</dd>
        </dl>
        <p className="mt-2 text-xs text-ink-500">{spokes.roundingRule}</p>
        <div className="mt-4">
          <LacingDiagram lacing={geometry.lacing} />
        </div>
      </Card>

      {geometry.topView && (
        <Card>
          <h2 className="text-xl font-bold">Chain and tire, from above</h2>
          <TopViewDiagram view={geometry.topView} unit={unit} />
        </Card>
      )}

      <Card>
        <div className="flex items-baseline justify-between">
          <h2 className="text-xl font-bold">Baseline cost</h2>
          <p className="text-sm text-ink-500">
            {formatCents(cost.lowCents, { whole: true })} to {formatCents(cost.highCents, { whole: true })}
          </p>
        </div>
        <p className="mb-3 text-xs text-ink-500">{cost.priceBookLabel}</p>
        <CostChart cost={cost} />
      </Card>

      <Card>
        <h2 className="text-xl font-bold">Weight, shipping and gearing</h2>
        <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-500">Built wheel (no tire)</dt>
          <dd>{formatGrams(mass.wheelG)}</dd>
          <dt className="text-ink-500">Spokes and nipples</dt>
          <dd>{formatGrams(mass.spokesG + mass.nipplesG)}</dd>
          <dt className="text-ink-500">Shipping box</dt>
          <dd>
            {result.shipping.lengthIn} × {result.shipping.widthIn} × {result.shipping.depthIn} in, billed as {result.shipping.billableLb} lb
          </dd>
        </dl>
        {gearing && (
          <table className="mt-3 w-full text-sm">
            <thead>
              <tr className="text-left text-ink-500">
                <th className="font-normal">Gear ({gearing.chainringTeeth}/{gearing.cogTeeth})</th>
                <th className="text-right font-normal">Gear inches</th>
                <th className="text-right font-normal">Development</th>
              </tr>
            </thead>
            <tbody>
              {gearing.gears.map((g) => (
                <tr key={g.label}>
                  <td>{g.label}</td>
                  <td className="text-right tabular-nums">{g.gearInches.toFixed(1)}</td>
                  <td className="text-right tabular-nums">{g.developmentM.toFixed(2)} m</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Card>
    </div>
  );
}
