'use client';

import { useId } from 'react';

/** One to five stars as a radio group: arrow keys move, each choice is read as "3 stars". */
export function StarPicker({ label, value, onChange, error }: { label: string; value: number | undefined; onChange: (stars: number) => void; error?: string }) {
  const name = useId();
  return (
    <fieldset className="space-y-1" aria-invalid={error ? true : undefined}>
      <legend className="text-sm font-semibold text-ink-700">{label}</legend>
      <div className="flex gap-1">
        {[1, 2, 3, 4, 5].map((n) => {
          const on = value !== undefined && n <= value;
          return (
            <label key={n} className="cursor-pointer">
              <input type="radio" name={name} value={n} checked={value === n} onChange={() => onChange(n)} className="peer sr-only" aria-label={`${label}: ${n} ${n === 1 ? 'star' : 'stars'}`} />
              <span
                aria-hidden="true"
                className={`block rounded px-0.5 text-2xl leading-none transition-colors peer-focus-visible:outline peer-focus-visible:outline-2 peer-focus-visible:outline-petrol-500 ${on ? 'text-brass-500' : 'text-chalk-300 hover:text-brass-300'}`}
              >
                ★
              </span>
            </label>
          );
        })}
      </div>
      {error && (
        <p role="alert" className="text-xs font-semibold text-rust-700">
          {error}
        </p>
      )}
    </fieldset>
  );
}
