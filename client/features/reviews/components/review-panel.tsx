import { useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import type { JobDetail } from '@shared/schemas/jobs';
import type { Review, reviewInputSchema } from '@shared/schemas/reviews';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { cn } from '@client/lib/cn';
import { formatDate } from '@client/lib/dates';
import { applyServerErrors } from '@client/lib/form-errors';
import { useJobReviews, useSubmitReview } from '../api/reviews';
import { lazyResolver } from '@client/lib/lazy-resolver';

const reviewInputResolver = lazyResolver(() => import('@shared/schemas/reviews').then((m) => m.reviewInputSchema));

type Side = 'builder' | 'shop';
export type ReviewViewer = Side | 'admin';

/** Reviews are written once the job has ended: accepted, or settled by an administrator. */
const REVIEW_STATES = new Set<JobDetail['status']>(['completed', 'resolved']);
const STARS = [1, 2, 3, 4, 5] as const;

const starLabel = (n: number) => `${n} ${n === 1 ? 'star' : 'stars'}`;

/** "4 of 5" in words, with five stars beside it for the eye (the words are what a screen reader reads). */
export function StarRating({ rating }: { rating: number }) {
  return (
    <span className="inline-flex items-center gap-2">
      <span aria-hidden className="tracking-wider text-brass-700">
        {STARS.map((n) => (n <= rating ? '★' : '☆')).join('')}
      </span>
      <span className="font-semibold">{rating} of 5</span>
    </span>
  );
}

function ReviewItem({ review, viewer }: { review: Review; viewer: ReviewViewer }) {
  const subject: Side = review.by === 'builder' ? 'shop' : 'builder';
  const author = review.by === viewer ? 'you' : `${review.authorName} (the ${review.by})`;
  const about = subject === viewer ? 'you' : `the ${subject}`;
  return (
    <li className="flex flex-col gap-1 rounded-lg border border-slate-200 bg-white p-4" data-testid="review">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <StarRating rating={review.rating} />
        <time dateTime={review.createdAt} className="text-sm text-ink-soft">
          {formatDate(review.createdAt)}
        </time>
      </div>
      <p className="text-sm text-ink-soft">
        By {author}, about {about}
      </p>
      <p className="whitespace-pre-wrap">{review.comment}</p>
    </li>
  );
}

type ReviewForm = z.input<typeof reviewInputSchema>;

function WriteReview({ jobId, viewer }: { jobId: string; viewer: Side }) {
  const id = useId();
  const [formError, setFormError] = useState<string>();
  const form = useForm<ReviewForm, unknown, z.output<typeof reviewInputSchema>>({
    resolver: reviewInputResolver,
    defaultValues: { rating: undefined, comment: '' },
  });
  const submit = useSubmitReview(jobId, {
    mutationConfig: {
      onSuccess: () => {
        form.reset();
        toast.success('Thank you. Your review is published.');
      },
      onError: (error) => setFormError(applyServerErrors(error, form.setError, ['rating', 'comment'])),
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    submit.mutate(values);
  });
  const ratingError = form.formState.errors.rating?.message;
  const about = viewer === 'builder' ? 'the shop' : 'the builder';
  const headingId = `${id}-heading`;

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby={headingId} className="flex flex-col gap-4">
      <h3 id={headingId} className="text-lg font-bold">
        {viewer === 'builder' ? 'Review the shop' : 'Review the builder'}
      </h3>
      <p className="text-sm text-ink-soft">
        {viewer === 'builder'
          ? 'How did the shop do: the work, the record, keeping you informed? Other builders read this when they compare bids.'
          : 'How was the builder to work with: clear instructions, parts as described, prompt answers?'}
      </p>
      {formError && <Notice tone="error">{formError}</Notice>}
      <Controller
        control={form.control}
        name="rating"
        render={({ field }) => (
          <fieldset className="flex flex-col gap-2" aria-describedby={ratingError ? `${id}-rating-error` : undefined}>
            <legend className="mb-1 text-sm font-semibold text-ink">Your rating of {about}</legend>
            <div className="flex flex-wrap gap-2">
              {STARS.map((n) => (
                <label
                  key={n}
                  className={cn(
                    'flex min-h-11 cursor-pointer items-center gap-2 rounded-lg bg-white px-3 py-2 ring-1 has-[:checked]:ring-2 has-[:checked]:ring-slate-700',
                    ratingError ? 'ring-fail' : 'ring-slate-300',
                  )}
                >
                  <input
                    ref={n === 1 ? field.ref : undefined}
                    type="radio"
                    name={field.name}
                    value={n}
                    checked={field.value === n}
                    onChange={() => field.onChange(n)}
                    onBlur={field.onBlur}
                    aria-invalid={ratingError ? true : undefined}
                    className="size-4 accent-slate-700"
                  />
                  <span aria-hidden className="text-brass-700">
                    {'★'.repeat(n)}
                  </span>
                  <span className="text-base text-ink">{starLabel(n)}</span>
                </label>
              ))}
            </div>
            {ratingError && (
              <p id={`${id}-rating-error`} className="text-sm font-semibold text-fail">
                {ratingError}
              </p>
            )}
          </fieldset>
        )}
      />
      <TextAreaField label="Your comment" rows={4} hint="At least 10 characters. It is shown with your name." error={form.formState.errors.comment?.message} {...form.register('comment')} />
      <div>
        <Button type="submit" busy={submit.isPending}>
          Publish the review
        </Button>
      </div>
    </form>
  );
}

export interface ReviewPanelProps {
  job: JobDetail;
  /** The builder reviews the shop and the shop the builder; an administrator only reads. */
  viewer: ReviewViewer;
}

/** Reviews on an ended job: what each side wrote, and the form for whoever has not written theirs yet. */
export function ReviewPanel({ job, viewer }: ReviewPanelProps) {
  const ended = REVIEW_STATES.has(job.status);
  const query = useJobReviews(job.id, { enabled: ended });
  if (!ended) return null;

  let body;
  if (query.isPending) body = <p className="text-ink-soft">Loading the reviews …</p>;
  else if (query.isError) body = <Notice tone="error" onRetry={() => void query.refetch()}>The reviews could not be loaded: {query.error.message}</Notice>;
  else {
    const { reviews, canReview } = query.data;
    body = (
      <>
        {reviews.length > 0 ? (
          <ul className="flex flex-col gap-3" aria-label="Reviews on this job">
            {reviews.map((review) => (
              <ReviewItem key={review.id} review={review} viewer={viewer} />
            ))}
          </ul>
        ) : (
          !canReview && <p className="text-ink-soft">No reviews on this job yet.</p>
        )}
        {canReview && viewer !== 'admin' && <WriteReview jobId={job.id} viewer={viewer} />}
      </>
    );
  }

  return (
    <Card className="flex flex-col gap-4">
      <h2 className="text-xl font-bold tracking-tight">Reviews</h2>
      {body}
    </Card>
  );
}
