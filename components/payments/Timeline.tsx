import type { TimelineStep } from '@/lib/payments/jobView';
import { formatWhen } from './api';

const DOT: Record<TimelineStep['state'], string> = {
  done: 'bg-petrol-600 border-petrol-600',
  current: 'bg-white border-brass-500 ring-4 ring-brass-100',
  upcoming: 'bg-white border-chalk-300',
};

/** The job's steps, done ones with their time, the current one marked. */
export function Timeline({ steps }: { steps: TimelineStep[] }) {
  return (
    <ol className="space-y-0" aria-label="What has happened so far">
      {steps.map((s, i) => (
        <li key={`${s.key}-${i}`} className="relative flex gap-3 pb-4 last:pb-0" data-step={s.key} data-state={s.state}>
          {i < steps.length - 1 && <span aria-hidden className="absolute left-[7px] top-4 h-full w-0.5 bg-chalk-200" />}
          <span aria-hidden className={`relative mt-1 inline-block h-4 w-4 shrink-0 rounded-full border-2 ${DOT[s.state]}`} />
          <div>
            <p className={`text-sm ${s.state === 'upcoming' ? 'text-ink-500' : 'font-semibold text-ink-900'}`}>
              {s.label}
              {s.state === 'current' && <span className="sr-only"> (next)</span>}
            </p>
            {s.at && <p className="text-xs text-ink-500">{formatWhen(s.at)}</p>}
          </div>
        </li>
      ))}
    </ol>
  );
}
