import { Stars } from '@/components/reviews/Stars';
import type { ShopRating } from '@/lib/reviews/shopRatings';

const ASPECT_LABELS = [
  { key: 'buildQuality', label: 'Build quality' },
  { key: 'communication', label: 'Communication' },
  { key: 'onTime', label: 'On time' },
] as const;

/** A shop's average stars, how many reviews, the ranking score and the aspect averages. */
export function RatingSummary({ rating }: { rating: ShopRating }) {
  if (rating.count === 0 || rating.average === null) {
    return (
      <p className="text-sm text-ink-500" data-testid="rating-summary">
        No reviews yet. Reviews appear here once riders of completed jobs have written them.
      </p>
    );
  }
  return (
    <div data-testid="rating-summary" className="space-y-3">
      <div className="flex items-baseline gap-3">
        <span className="font-display text-4xl font-bold text-ink-900">{rating.average.toFixed(1)}</span>
        <div>
          <Stars value={rating.average} size="lg" />
          <p className="text-sm text-ink-500">
            from {rating.count} {rating.count === 1 ? 'review' : 'reviews'}
          </p>
        </div>
      </div>
      <dl className="space-y-1 text-sm">
        {ASPECT_LABELS.map((a) => {
          const v = rating.aspects[a.key];
          return (
            <div key={a.key} className="flex justify-between gap-3">
              <dt className="text-ink-500">{a.label}</dt>
              <dd className="font-semibold text-ink-700">{v === null ? '—' : `${v.toFixed(1)} / 5`}</dd>
            </div>
          );
        })}
        <div className="flex justify-between gap-3 border-t border-chalk-200 pt-1">
          <dt className="text-ink-500" title="The lower end of a 95 % Wilson interval for the share of 4- and 5-star reviews: it grows with both the share and the number of reviews.">
            Confidence score
          </dt>
          <dd className="font-semibold text-ink-700">{Math.round(rating.score * 100)} / 100</dd>
        </div>
      </dl>
      <p className="text-xs text-ink-500">
        {rating.positive} of {rating.count} gave 4 or 5 stars. The confidence score weighs that share by how many reviews there are, so a long good record counts for more than one
        glowing review.
      </p>
    </div>
  );
}
