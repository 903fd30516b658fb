// The shapes people send about a job's money, shared by the forms and the route handlers.
import { z } from 'zod';

export const shipInputSchema = z.discriminatedUnion('handover', [
  z.object({
    handover: z.literal('carrier'),
    carrier: z.string().trim().min(2, 'Name the carrier.').max(60, 'Keep the carrier name under 60 characters.'),
    trackingNumber: z
      .string()
      .trim()
      .min(4, 'Enter the tracking number.')
      .max(60, 'That tracking number is too long.')
      .regex(/^[A-Za-z0-9 -]+$/, 'Use only letters, digits, spaces and dashes.'),
  }),
  z.object({ handover: z.literal('pickup') }),
]);
export type ShipInput = z.infer<typeof shipInputSchema>;

export const cancelInputSchema = z.object({
  reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').optional().default(''),
});
export type CancelInput = z.infer<typeof cancelInputSchema>;

export const DISPUTE_REASONS = {
  not_received: 'The wheel has not arrived',
  not_as_described: 'The wheel is not what was agreed',
  damaged: 'The wheel arrived damaged',
  late: 'The build is far past its promised date',
  no_response: 'The other side has stopped answering',
  other: 'Something else',
} as const;
export type DisputeReason = keyof typeof DISPUTE_REASONS;

export const disputeInputSchema = z.object({
  reason: z.enum(Object.keys(DISPUTE_REASONS) as [DisputeReason, ...DisputeReason[]], { error: 'Choose what went wrong.' }),
  details: z.string().trim().min(20, 'Tell the admin what happened in at least 20 characters.').max(4000, 'Keep it under 4000 characters.'),
});
export type DisputeInput = z.infer<typeof disputeInputSchema>;

export const disputeNoteSchema = z.object({
  body: z.string().trim().min(2, 'Write something first.').max(4000, 'Keep it under 4000 characters.'),
});

export const RESOLUTIONS = ['release', 'refund', 'split'] as const;
export type Resolution = (typeof RESOLUTIONS)[number];

export const resolveInputSchema = z
  .object({
    resolution: z.enum(RESOLUTIONS, { error: 'Choose release, refund or split.' }),
    /** For a split: what goes back to the rider, in cents; the rest goes to the builder. */
    refundCents: z.number().int('Use whole cents.').min(1, 'A split refunds something.').optional(),
    reason: z.string().trim().min(20, 'Write the reason for both sides in at least 20 characters.').max(2000, 'Keep it under 2000 characters.'),
  })
  .refine((v) => v.resolution !== 'split' || v.refundCents !== undefined, { message: 'Enter how much goes back to the rider.', path: ['refundCents'] });
export type ResolveInput = z.infer<typeof resolveInputSchema>;
