import type { CostEstimate } from '@/lib/wheel';
import { formatCents } from '@/lib/format';

const BAR_COLOURS = ['#0f5d5c', '#17716f', '#b98a2e', '#7d5a14', '#353f4f', '#5a6474', '#4a7a2f', '#b4441f', '#a0a8b5'];

/** Where the baseline money goes: one stacked bar and a table of the same lines. */
export function CostChart({ cost }: { cost: CostEstimate }) {
  const total = cost.lines.reduce((sum, l) => sum + l.cents, 0) || 1;
  return (
    <div className="space-y-3" data-testid="cost-chart">
      <div className="flex h-5 w-full overflow-hidden rounded" role="img" aria-label="Baseline cost by part">
        {cost.lines.map((line, i) => (
          <div key={line.key} style={{ width: `${(line.cents / total) * 100}%`, background: BAR_COLOURS[i % BAR_COLOURS.length] }} title={`${line.label}: ${formatCents(line.cents)}`} />
        ))}
      </div>
      <table className="w-full text-sm">
        <tbody>
          {cost.lines.map((line, i) => (
            <tr key={line.key} className="border-b border-chalk-100">
              <td className="py-1">
                <span className="mr-2 inline-block h-2.5 w-2.5 rounded-full align-middle" style={{ background: BAR_COLOURS[i % BAR_COLOURS.length] }} aria-hidden="true" />
                {line.label}
              </td>
              <td className="py-1 text-right tabular-nums">{formatCents(line.cents)}</td>
            </tr>
          ))}
          <tr>
            <td className="pt-2 font-semibold">Typical total</td>
            <td className="pt-2 text-right font-semibold tabular-nums">{formatCents(cost.typicalCents)}</td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}
