import type { ReactNode } from 'react';

export function Card({ children, className = '' }: { children: ReactNode; className?: string }) {
  return <section className={`rounded-lg border border-chalk-200 bg-white p-5 shadow-card ${className}`}>{children}</section>;
}
