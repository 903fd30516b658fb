import type { HTMLAttributes, ReactNode } from 'react';

export function Card({ children, className = '', ...rest }: HTMLAttributes<HTMLElement> & { children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-chalk-200 bg-white p-5 shadow-card ${className}`} {...rest}>
      {children}
    </section>
  );
}
