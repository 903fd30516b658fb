import Link from 'next/link';
import type { ButtonHTMLAttributes, ReactNode } from 'react';

type Tone = 'primary' | 'secondary' | 'quiet' | 'danger';

const tones: Record<Tone, string> = {
  primary: 'bg-petrol-600 text-white hover:bg-petrol-700 disabled:bg-ink-300',
  secondary: 'bg-white text-petrol-700 border border-petrol-500 hover:bg-petrol-50 disabled:text-ink-300 disabled:border-ink-300',
  quiet: 'bg-transparent text-ink-700 hover:bg-chalk-100',
  danger: 'bg-rust-500 text-white hover:bg-rust-700',
};

export function buttonClass(tone: Tone = 'primary', extra = ''): string {
  return `inline-flex items-center justify-center gap-2 rounded px-4 py-2 text-sm font-semibold no-underline transition-colors hover:no-underline disabled:cursor-not-allowed ${tones[tone]} ${extra}`;
}

export function Button({ tone = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone }) {
  return <button className={buttonClass(tone, className)} {...props} />;
}

export function ButtonLink({ href, tone = 'primary', children, className = '' }: { href: string; tone?: Tone; children: ReactNode; className?: string }) {
  return (
    <Link href={href} className={buttonClass(tone, className)}>
      {children}
    </Link>
  );
}
