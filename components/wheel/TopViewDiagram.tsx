import type { FitResult } from '@/lib/wheel';
import { formatLength, type LengthUnit } from '@/lib/format';

type TopView = NonNullable<FitResult['geometry']['topView']>;

/**
 * Looking down on the rear of the bike: the tire's outline beside the chain line from cog to chainring,
 * with the narrowest gap marked. Sideways distances are stretched so millimetres of clearance show.
 */
export function TopViewDiagram({ view, unit }: { view: TopView; unit: LengthUnit }) {
  const width = 420;
  const height = 300;
  const maxX = Math.max(view.chainringXMm, view.cogXMm, view.tireHalfWidthMm) + 30;
  const sx = (xMm: number) => width / 2 + (xMm / maxX) * (width / 2 - 10);
  const minY = -view.tireOuterRadiusMm - 10;
  const maxY = view.chainstayLengthMm + view.chainringPitchRadiusMm + 10;
  const sy = (yMm: number) => height - 10 - ((yMm - minY) / (maxY - minY)) * (height - 20);
  // The outline is given ahead of the axle; the tire is the same behind it.
  const ahead = view.wheelOutline;
  const fullSide = [...[...ahead].reverse().map((p) => ({ y: -p.yMm, w: p.halfWidthMm })), ...ahead.map((p) => ({ y: p.yMm, w: p.halfWidthMm }))];
  const outlineRight = fullSide.map((p) => `${sx(p.w).toFixed(1)},${sy(p.y).toFixed(1)}`);
  const outlineLeft = [...fullSide].reverse().map((p) => `${sx(-p.w).toFixed(1)},${sy(p.y).toFixed(1)}`);
  const clear = view.clearanceMm;
  const tone = clear === null ? '#5a6474' : clear < 0 ? '#b4441f' : clear < 3 ? '#c18a0f' : '#4a7a2f';
  // The amber reads as a line but is too light for small text (WCAG AA wants 4.5:1): a darker shade there.
  const textTone = tone === '#c18a0f' ? '#845c00' : tone;
  return (
    <figure className="space-y-2">
      <svg viewBox={`0 0 ${width} ${height}`} className="w-full" role="img" aria-label="Top view of tire, chain and cog" data-testid="topview-diagram">
        <line x1={sx(0)} y1={0} x2={sx(0)} y2={height} stroke="#d6cab6" strokeDasharray="4 4" />
        <polygon points={[...outlineRight, ...outlineLeft].join(' ')} fill="#353f4f" fillOpacity="0.85" />
        {/* hub axle */}
        <line x1={sx(-view.rimHalfWidthMm - 20)} y1={sy(0)} x2={sx(view.cogXMm + 10)} y2={sy(0)} stroke="#1b2230" strokeWidth="3" />
        {/* cog and chainring seen edge-on */}
        <line x1={sx(view.cogXMm)} y1={sy(-view.cogPitchRadiusMm)} x2={sx(view.cogXMm)} y2={sy(view.cogPitchRadiusMm)} stroke="#b98a2e" strokeWidth="4" />
        <line
          x1={sx(view.chainringXMm)}
          y1={sy(view.chainstayLengthMm - view.chainringPitchRadiusMm)}
          x2={sx(view.chainringXMm)}
          y2={Math.max(4, sy(view.chainstayLengthMm + view.chainringPitchRadiusMm))}
          stroke="#b98a2e"
          strokeWidth="4"
        />
        {/* the chain's inner edge along the stay */}
        <line
          x1={sx(view.cogXMm - view.chainHalfWidthMm)}
          y1={sy(0)}
          x2={sx(view.chainringXMm - view.chainHalfWidthMm)}
          y2={sy(view.chainstayLengthMm)}
          stroke="#0f5d5c"
          strokeWidth="2.5"
        />
        {view.closestYMm !== null && view.chainXAtClosestMm !== null && view.obstacleHalfWidthAtClosestMm !== null && (
          <g>
            <line
              x1={sx(view.obstacleHalfWidthAtClosestMm)}
              y1={sy(view.closestYMm)}
              x2={sx(view.chainXAtClosestMm - view.chainHalfWidthMm)}
              y2={sy(view.closestYMm)}
              stroke={tone}
              strokeWidth="3"
            />
            <circle cx={sx(view.chainXAtClosestMm - view.chainHalfWidthMm)} cy={sy(view.closestYMm)} r="4" fill={tone} />
          </g>
        )}
        <text x={sx(0) + 4} y={14} fontSize="11" fill="#5a6474">
          frame centre
        </text>
        <text x={sx(view.cogXMm) + 6} y={sy(0) - 6} fontSize="11" fill="#7d5a14">
          cog
        </text>
        <text x={sx(view.chainringXMm) - 60} y={Math.max(14, sy(view.chainstayLengthMm) - 4)} fontSize="11" fill="#7d5a14">
          chainring
        </text>
      </svg>
      <figcaption className="text-center text-xs text-ink-500">
        Narrowest gap between chain and {view.clearancePart ?? 'tire'}:{' '}
        <strong style={{ color: textTone }} data-testid="clearance">
          {clear === null ? 'not computed' : formatLength(clear, unit)}
        </strong>
        . Sideways distances are stretched to show the gap.
      </figcaption>
    </figure>
  );
}
