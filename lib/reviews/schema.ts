// Shapes of a review as the form sends it, shared by the form and the route handlers.
import { z } from 'zod';

export const REVIEW_SIDES = ['rider', 'shop'] as const;
/** Who wrote a review: the job's rider (about the shop) or the job's shop (about the rider). */
export type ReviewSide = (typeof REVIEW_SIDES)[number];

export const otherSide = (side: ReviewSide): ReviewSide => (side === 'rider' ? 'shop' : 'rider');

/** The aspects each side rates, in the order forms show them. */
export const ASPECTS = {
  rider: [
    { key: 'buildQuality', label: 'Build quality' },
    { key: 'communication', label: 'Communication' },
    { key: 'onTime', label: 'On time' },
  ],
  shop: [
    { key: 'clearSpec', label: 'Clear spec' },
    { key: 'communication', label: 'Communication' },
    { key: 'payment', label: 'Payment' },
  ],
} as const satisfies Record<ReviewSide, readonly { key: string; label: string }[]>;

export type ShopAspects = { buildQuality: number; communication: number; onTime: number };
export type RiderAspects = { clearSpec: number; communication: number; payment: number };
export type AspectKey = keyof ShopAspects | keyof RiderAspects;

export const REVIEW_TEXT_MAX = 2000;

const stars = (label: string) =>
  z
    .number({ error: `Rate ${label} from 1 to 5 stars.` })
    .int({ error: `Rate ${label} in whole stars.` })
    .min(1, { error: `Rate ${label} from 1 to 5 stars.` })
    .max(5, { error: `Rate ${label} from 1 to 5 stars.` });

const text = z
  .string({ error: 'Write a few words, or leave it empty.' })
  .trim()
  .max(REVIEW_TEXT_MAX, { error: `Keep the review under ${REVIEW_TEXT_MAX} characters.` })
  .default('');

const shopAspectsSchema = z.object(
  { buildQuality: stars('build quality'), communication: stars('communication'), onTime: stars('on time') },
  { error: 'Rate build quality, communication and on time.' },
);
const riderAspectsSchema = z.object(
  { clearSpec: stars('how clear the spec was'), communication: stars('communication'), payment: stars('payment') },
  { error: 'Rate the spec, communication and payment.' },
);

const jobId = z.uuid({ error: 'Choose the job to review.' });

/** POST /api/reviews: the side says which aspects come with it; the server checks the writer is on that side. */
export const reviewInputSchema = z.discriminatedUnion(
  'side',
  [
    z.object({ jobId, side: z.literal('rider'), overall: stars('the job overall'), aspects: shopAspectsSchema, text }),
    z.object({ jobId, side: z.literal('shop'), overall: stars('the job overall'), aspects: riderAspectsSchema, text }),
  ],
  { error: 'Say whether you review as the rider or as the shop.' },
);
export type ReviewInput = z.infer<typeof reviewInputSchema>;
export type ReviewFormValues = z.input<typeof reviewInputSchema>;

/** PATCH /api/reviews/:id: any of the stars or the text; aspects must be the review's own side's. */
export const reviewEditSchema = z.strictObject(
  {
    overall: stars('the job overall').optional(),
    aspects: z
      .strictObject(
        {
          buildQuality: stars('build quality').optional(),
          communication: stars('communication').optional(),
          onTime: stars('on time').optional(),
          clearSpec: stars('how clear the spec was').optional(),
          payment: stars('payment').optional(),
        },
        { error: 'Rate only the aspects shown on the form.' },
      )
      .optional(),
    text: z.string().trim().max(REVIEW_TEXT_MAX, { error: `Keep the review under ${REVIEW_TEXT_MAX} characters.` }).optional(),
  },
  { error: 'Only the stars and the text of a review can change.' },
);
export type ReviewEdit = z.infer<typeof reviewEditSchema>;

/** GET /api/reviews?jobId= */
export const jobReviewsQuerySchema = z.object({ jobId });
