import Link from 'next/link';

/** The Lacewright mark: a small hub with four crossing spokes, beside the name. */
export function NameMark() {
  return (
    <Link href="/" className="flex items-center gap-2 text-ink-900 no-underline hover:no-underline" aria-label="Lacewright home">
      <svg width="30" height="30" viewBox="0 0 32 32" aria-hidden="true">
        <circle cx="16" cy="16" r="14" fill="none" stroke="#0f5d5c" strokeWidth="3" />
        <circle cx="16" cy="16" r="4" fill="#b98a2e" />
        <g stroke="#0f5d5c" strokeWidth="1.4" strokeLinecap="round">
          <line x1="12.5" y1="14" x2="24" y2="4.8" />
          <line x1="19.5" y1="14" x2="8" y2="4.8" />
          <line x1="12.5" y1="18" x2="24" y2="27.2" />
          <line x1="19.5" y1="18" x2="8" y2="27.2" />
        </g>
      </svg>
      <span className="font-display text-xl font-extrabold tracking-tight">
        Lace<span className="text-petrol-600">wright</span>
      </span>
    </Link>
  );
}
