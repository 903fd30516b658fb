import type { ReviewView } from '@/lib/reviews/rows';
import { Stars } from './Stars';

export interface ReviewListProps {
  /** Reviews the viewer may read: `listShopReviews`, or a job's reviews from `GET /api/reviews?jobId=`. */
  reviews: ReviewView[];
  /** Shown when there are none; nothing renders without it. */
  emptyText?: string;
  /** Show the aspect stars under each review (default true). */
  showAspects?: boolean;
}

const day = (iso: string) => new Date(iso).toLocaleDateString('en-US', { year: 'numeric', month: 'short', day: 'numeric', timeZone: 'UTC' });

/** Reviews as a list: overall stars, who and when, the aspects and the text. No client code: fine in server components. */
export function ReviewList({ reviews, emptyText, showAspects = true }: ReviewListProps) {
  if (!reviews.length) return emptyText ? <p className="text-sm text-ink-500">{emptyText}</p> : null;
  return (
    <ul className="divide-y divide-chalk-200" data-testid="review-list">
      {reviews.map((r) => (
        <li key={r.id} className="py-4 first:pt-0 last:pb-0">
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <Stars value={r.overall} />
            <span className="text-sm font-semibold text-ink-900">{r.authorLabel}</span>
            <span className="text-xs text-ink-500">{day(r.createdAt)}</span>
          </div>
          {showAspects && (
            <dl className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-500">
              {r.aspects.map((a) => (
                <div key={a.key} className="flex items-center gap-1">
                  <dt>{a.label}</dt>
                  <dd className="font-semibold text-ink-700">{a.stars}/5</dd>
                </div>
              ))}
            </dl>
          )}
          {r.text && <p className="mt-2 whitespace-pre-line text-sm text-ink-700">{r.text}</p>}
        </li>
      ))}
    </ul>
  );
}
