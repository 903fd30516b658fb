import type { ReactNode } from 'react';

type Tone = 'info' | 'caution' | 'danger' | 'success';

const tones: Record<Tone, string> = {
  info: 'border-petrol-500 bg-petrol-50 text-petrol-900',
  caution: 'border-amber-500 bg-amber-50 text-amber-700',
  danger: 'border-rust-500 bg-rust-50 text-rust-700',
  success: 'border-moss-500 bg-moss-50 text-moss-700',
};

export function Notice({ tone = 'info', title, children }: { tone?: Tone; title?: string; children: ReactNode }) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`rounded border-l-4 px-4 py-3 text-sm ${tones[tone]}`}>
      {title && <p className="font-semibold">{title}</p>}
      <div>{children}</div>
    </div>
  );
}
