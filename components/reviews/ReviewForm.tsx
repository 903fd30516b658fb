'use client';

// A job's reviews for one side of it: write or change your own review, and read the other side's once it
// is open to view (both have written, or the review period is over). Drop it into a job page:
//   <ReviewForm jobId={job.id} side="rider" />   (the rider, reviewing the shop)
//   <ReviewForm jobId={job.id} side="shop" />    (a member of the shop, reviewing the rider)
// Works with or without a QueryProvider above it.
import { QueryClientContext, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useContext, useId, useState } from 'react';
import { ApiError, fetchJson } from '@/components/market/builder/fetchJson';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { Button } from '@/components/ui/Button';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import type { JobReviews } from '@/lib/reviews/jobReviews';
import type { ReviewView } from '@/lib/reviews/rows';
import { ASPECTS, REVIEW_TEXT_MAX, reviewInputSchema, type ReviewSide } from '@/lib/reviews/schema';
import { ReviewList } from './ReviewList';
import { StarPicker } from './StarPicker';

export interface ReviewFormProps {
  jobId: string;
  /** The viewer's side of the job: 'rider' reviews the shop, 'shop' reviews the rider. */
  side: ReviewSide;
}

const reviewsKey = (jobId: string) => ['reviews', jobId] as const;
const day = (iso: string) => new Date(iso).toLocaleDateString('en-US', { year: 'numeric', month: 'short', day: 'numeric', timeZone: 'UTC' });

const WORDS: Record<ReviewSide, { mine: string; other: string; heading: string }> = {
  rider: { mine: 'Your review of the shop', other: 'The shop’s review of you', heading: 'Review the shop' },
  shop: { mine: 'Your shop’s review of the rider', other: 'The rider’s review of your shop', heading: 'Review the rider' },
};

export function ReviewForm(props: ReviewFormProps) {
  const hasClient = useContext(QueryClientContext) !== undefined;
  if (hasClient) return <JobReviewsPanel {...props} />;
  return (
    <QueryProvider>
      <JobReviewsPanel {...props} />
    </QueryProvider>
  );
}

function JobReviewsPanel({ jobId, side }: ReviewFormProps) {
  const [editing, setEditing] = useState(false);
  const query = useQuery({ queryKey: reviewsKey(jobId), queryFn: ({ signal }) => fetchJson<JobReviews>(`/api/reviews?${new URLSearchParams({ jobId })}`, { signal }) });
  if (query.isPending) return <Spinner label="Loading reviews…" />;
  if (query.isError) return <Notice tone="danger">{query.error.message}</Notice>;
  const data = query.data;
  const mine = side === 'rider' ? data.byRider : data.byShop;
  const other = side === 'rider' ? data.byShop : data.byRider;
  const otherWritten = data.written[side === 'rider' ? 'shop' : 'rider'];
  const words = WORDS[side];

  return (
    <section aria-labelledby={`${jobId}-reviews`} className="space-y-5" data-testid="job-reviews">
      <h2 id={`${jobId}-reviews`} className="text-lg font-bold">
        Reviews
      </h2>
      {!data.jobCompleted && <p className="text-sm text-ink-500">Both sides can review the job once it is completed.</p>}

      {mine && !editing && (
        <div className="space-y-2">
          <h3 className="text-sm font-semibold text-ink-700">{words.mine}</h3>
          <ReviewList reviews={[mine]} />
          {mine.canEdit ? (
            <p className="flex flex-wrap items-center gap-3 text-xs text-ink-500">
              You can change it until {day(mine.editableUntil < mine.openFrom ? mine.editableUntil : mine.openFrom)}, while the other side cannot read it yet.
              <Button tone="secondary" type="button" onClick={() => setEditing(true)}>
                Change my review
              </Button>
            </p>
          ) : (
            <p className="text-xs text-ink-500">This review can no longer change.</p>
          )}
        </div>
      )}

      {(data.canWrite || (mine && editing)) && (
        <ReviewEditor
          jobId={jobId}
          side={side}
          heading={mine ? 'Change your review' : words.heading}
          existing={mine && editing ? mine : null}
          writeUntil={data.writeUntil}
          onDone={() => setEditing(false)}
        />
      )}

      {data.jobCompleted && !mine && !data.canWrite && <p className="text-sm text-ink-500">The time to review this job is over.</p>}

      <div className="space-y-2">
        <h3 className="text-sm font-semibold text-ink-700">{words.other}</h3>
        {other ? (
          <ReviewList reviews={[other]} />
        ) : otherWritten ? (
          <p className="text-sm text-ink-500">
            Written, and kept hidden until you have written yours{data.writeUntil ? ` or until ${day(data.writeUntil)}` : ''}. Neither side sees the other’s review first.
          </p>
        ) : (
          <p className="text-sm text-ink-500">Not written yet.</p>
        )}
      </div>
    </section>
  );
}

type Stars = Record<string, number | undefined>;

function ReviewEditor({
  jobId,
  side,
  heading,
  existing,
  writeUntil,
  onDone,
}: {
  jobId: string;
  side: ReviewSide;
  heading: string;
  existing: ReviewView | null;
  writeUntil: string | null;
  onDone: () => void;
}) {
  const client = useQueryClient();
  const textId = useId();
  const [overall, setOverall] = useState<number | undefined>(existing?.overall);
  const [aspects, setAspects] = useState<Stars>(() => Object.fromEntries((existing?.aspects ?? []).map((a) => [a.key, a.stars])));
  const [text, setText] = useState(existing?.text ?? '');
  const [errors, setErrors] = useState<Record<string, string>>({});

  const save = useMutation({
    mutationFn: (body: unknown) =>
      existing ? fetchJson<ReviewView>(`/api/reviews/${existing.id}`, { method: 'PATCH', json: body }) : fetchJson<ReviewView>('/api/reviews', { method: 'POST', json: body }),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: reviewsKey(jobId) });
      onDone();
    },
    onError: (err) => {
      if (err instanceof ApiError) setErrors(Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v[0]])));
    },
  });

  function submit(e: React.FormEvent) {
    e.preventDefault();
    const parsed = reviewInputSchema.safeParse({ jobId, side, overall, aspects, text });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])));
      return;
    }
    setErrors({});
    const { overall: o, aspects: a, text: t } = parsed.data;
    save.mutate(existing ? { overall: o, aspects: a, text: t } : parsed.data);
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4 rounded-lg border border-chalk-200 bg-chalk-50 p-4" aria-label={heading}>
      <h3 className="font-display text-base font-bold">{heading}</h3>
      <StarPicker label="Overall" value={overall} onChange={setOverall} error={errors.overall} />
      <div className="grid gap-3 sm:grid-cols-3">
        {ASPECTS[side].map((a) => (
          <StarPicker key={a.key} label={a.label} value={aspects[a.key]} onChange={(n) => setAspects((s) => ({ ...s, [a.key]: n }))} error={errors[`aspects.${a.key}`] ?? errors.aspects} />
        ))}
      </div>
      <div className="space-y-1">
        <label htmlFor={textId} className="block text-sm font-semibold text-ink-700">
          In your words (optional)
        </label>
        <textarea
          id={textId}
          value={text}
          maxLength={REVIEW_TEXT_MAX}
          rows={4}
          onChange={(e) => setText(e.target.value)}
          className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500"
        />
        {errors.text && (
          <p role="alert" className="text-xs font-semibold text-rust-700">
            {errors.text}
          </p>
        )}
      </div>
      <p className="text-xs text-ink-500">
        The other side reads your review only once they have written theirs{writeUntil ? `, or after ${day(writeUntil)}` : ''}. Keep it to the job: the build, the talk and the timing.
      </p>
      {save.isError && <Notice tone="danger">{save.error.message}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : existing ? 'Save changes' : 'Post review'}
        </Button>
        {existing && (
          <Button type="button" tone="quiet" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
