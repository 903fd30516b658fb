import type { ReactNode } from 'react';

type Tone = 'neutral' | 'petrol' | 'brass' | 'moss' | 'rust' | 'amber';

const tones: Record<Tone, string> = {
  neutral: 'bg-chalk-100 text-ink-700',
  petrol: 'bg-petrol-50 text-petrol-700',
  brass: 'bg-brass-100 text-brass-700',
  moss: 'bg-moss-50 text-moss-700',
  rust: 'bg-rust-50 text-rust-700',
  amber: 'bg-amber-50 text-amber-700',
};

export function Badge({ tone = 'neutral', children }: { tone?: Tone; children: ReactNode }) {
  return <span className={`inline-flex items-center rounded-full px-2.5 py-0.5 text-xs font-semibold ${tones[tone]}`}>{children}</span>;
}
