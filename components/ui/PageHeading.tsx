import type { ReactNode } from 'react';

export function PageHeading({ title, lead, actions }: { title: string; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-chalk-200 pb-4">
      <div>
        <h1 className="text-3xl font-bold text-ink-900">{title}</h1>
        {lead && <p className="mt-1 max-w-2xl text-ink-500">{lead}</p>}
      </div>
      {actions}
    </div>
  );
}
