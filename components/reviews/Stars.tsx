// Stars out of five, read aloud as a number. Fractions show as a partly filled last star.
export function Stars({ value, size = 'sm' }: { value: number; size?: 'sm' | 'lg' }) {
  const clamped = Math.max(0, Math.min(5, value));
  const label = `${Number.isInteger(clamped) ? clamped : clamped.toFixed(1)} of 5 stars`;
  return (
    <span role="img" aria-label={label} className={`relative inline-block whitespace-nowrap leading-none tracking-wider ${size === 'lg' ? 'text-xl' : 'text-sm'}`}>
      <span aria-hidden="true" className="text-chalk-300">
        ★★★★★
      </span>
      <span aria-hidden="true" className="absolute inset-y-0 left-0 overflow-hidden text-brass-500" style={{ width: `${(clamped / 5) * 100}%` }}>
        ★★★★★
      </span>
    </span>
  );
}
