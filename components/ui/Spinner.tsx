export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div className="flex items-center gap-3 py-10 text-ink-500" role="status" aria-live="polite">
      <span className="inline-block h-5 w-5 animate-spin rounded-full border-2 border-petrol-500 border-t-transparent" aria-hidden="true" />
      {label}
    </div>
  );
}
