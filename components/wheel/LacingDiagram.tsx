import type { FitResult } from '@/lib/wheel';

type Lacing = FitResult['geometry']['lacing'];

/**
 * Side view of the laced wheel, drawn from the computed pattern: each spoke runs from its flange hole
 * (on the pitch circle, scaled up so it can be seen) to its rim hole on the ERD circle.
 */
export function LacingDiagram({ lacing }: { lacing: Lacing }) {
  const size = 320;
  const c = size / 2;
  const rimR = c - 14;
  // The flange is drawn larger than scale, or on a 26-inch wheel it would be a dot.
  const hubR = Math.max(rimR * (lacing.flangePcdMm / lacing.erdMm) * 1.6, 18);
  const at = (r: number, deg: number) => ({ x: c + r * Math.sin((deg * Math.PI) / 180), y: c - r * Math.cos((deg * Math.PI) / 180) });
  const label = lacing.crosses === 0 ? 'radial' : `${lacing.crosses}-cross`;
  return (
    <figure className="space-y-2">
      <svg viewBox={`0 0 ${size} ${size}`} className="mx-auto w-full max-w-[320px]" role="img" aria-label={`Lacing diagram: ${lacing.spokes} spokes, ${label}`} data-testid="lacing-diagram">
        <circle cx={c} cy={c} r={rimR + 6} fill="none" stroke="#1b2230" strokeWidth="10" />
        <circle cx={c} cy={c} r={rimR} fill="none" stroke="#b98a2e" strokeWidth="2" />
        {lacing.pattern.map((s, i) => {
          const a = at(hubR, s.hubAngleDeg);
          const b = at(rimR, s.rimAngleDeg);
          return (
            <line
              key={i}
              x1={a.x.toFixed(2)}
              y1={a.y.toFixed(2)}
              x2={b.x.toFixed(2)}
              y2={b.y.toFixed(2)}
              stroke={s.side === 'left' ? '#0f5d5c' : '#b4441f'}
              strokeWidth={lacing.spokes > 72 ? 0.6 : 1}
              strokeOpacity={0.9}
            />
          );
        })}
        <circle cx={c} cy={c} r={hubR} fill="none" stroke="#353f4f" strokeWidth="1.5" />
        <circle cx={c} cy={c} r={hubR * 0.45} fill="#353f4f" />
      </svg>
      <figcaption className="text-center text-xs text-ink-500">
        {lacing.spokes} spokes, {label}. <span className="text-petrol-600">Left flange</span> and <span className="text-rust-700">right flange</span>; hub
        drawn larger than scale.
      </figcaption>
    </figure>
  );
}
