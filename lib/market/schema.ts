// Shapes of what riders and builders send, shared by the forms and the route handlers.
import { z } from 'zod';
import {
  NOMINAL_DIAMETERS_IN,
  SPOKE_GAUGES,
  finishSchema,
  fitRequestSchema,
  hubIdSchema,
  nominalDiameterSchema,
  wheelPositionSchema,
} from '@/lib/wheel';
import { toFitInput, FIT_FIELD_TO_REQUEST_PATH } from './spec';

const MAX_LINE_CENTS = 2_000_000; // $20,000 for one line of a bid: far above any real wheel
const MAX_BUDGET_CENTS = 5_000_000;
const DAY_MS = 86_400_000;

const millimetres = (label: string, min: number, max: number) =>
  z
    .number({ error: `${label} must be a number of millimetres.` })
    .min(min, { error: `${label} must be at least ${min} mm.` })
    .max(max, { error: `${label} must be at most ${max} mm.` });

const wholeNumber = (label: string, min: number, max: number) =>
  z
    .number({ error: `${label} must be a number.` })
    .int({ error: `${label} must be a whole number.` })
    .min(min, { error: `${label} must be at least ${min}.` })
    .max(max, { error: `${label} must be at most ${max}.` });

const cents = (label: string, max: number) =>
  z
    .number({ error: `${label} must be an amount in cents.` })
    .int({ error: `${label} must be whole cents.` })
    .min(0, { error: `${label} cannot be negative.` })
    .max(max, { error: `${label} must be at most $${(max / 100).toLocaleString('en-US')}.` });

/** Today's date in UTC as YYYY-MM-DD. */
export const todayUtc = (now = new Date()): string => now.toISOString().slice(0, 10);

/** A date-only value means the end of that day in UTC. */
export function endOfDayUtc(value: string): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T23:59:59.999Z`) : new Date(value);
}

// Format only: forms share this schema, and the ZIP dataset is too big for the browser. The domain
// functions that place a request or a shop look the code up and answer 400 when it is unknown.
export const zipSchema = z
  .string({ error: 'Enter a 5-digit US ZIP code.' })
  .trim()
  .regex(/^\d{5}$/, { error: 'Enter a 5-digit US ZIP code.' });

export const lacingSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('radial') }),
    z.object({ kind: z.literal('cross'), crosses: wholeNumber('Crosses', 1, 4) }),
    z.object({
      kind: z.literal('custom'),
      description: z
        .string({ error: 'Describe the lacing pattern.' })
        .trim()
        .min(3, { error: 'Describe the lacing pattern in a few words.' })
        .max(500, { error: 'Keep the lacing description under 500 characters.' }),
    }),
  ],
  { error: 'Choose radial, 1 to 4 cross, or a custom pattern described in words.' },
);
export type Lacing = z.infer<typeof lacingSchema>;

/** One wheel. Lengths in mm; the hub id names the hub class, its brake and its over-locknut width. */
export const wheelSpecSchema = z.object(
  {
    position: wheelPositionSchema,
    nominalDiameterIn: nominalDiameterSchema,
    rimWidthMm: millimetres('Rim width', 19, 150),
    tireWidthMm: millimetres('Tire width', 20, 160),
    spokes: wholeNumber('Spoke count', 12, 144),
    spokeGauge: wholeNumber('Spoke gauge', 8, 15),
    lacing: lacingSchema,
    hubId: hubIdSchema,
    finish: finishSchema,
  },
  { error: 'Describe the wheel.' },
);
export type WheelSpec = z.infer<typeof wheelSpecSchema>;

export const BB_SHELL_TYPES = ['threaded', 'one-piece', 'press-fit'] as const;

export const frameSpecSchema = z.object(
  {
    rearSpacingMm: millimetres('Frame rear spacing', 100, 200),
    frontSpacingMm: millimetres('Fork spacing', 90, 150),
    bbShellWidthMm: millimetres('Bottom-bracket shell width', 60, 130),
    bbShellType: z.enum(BB_SHELL_TYPES, { error: 'Bottom-bracket shell type must be threaded, one-piece or press-fit.' }),
    chainstayLengthMm: millimetres('Chainstay length', 300, 700).optional(),
  },
  { error: 'Describe the frame.' },
);
export type FrameSpec = z.infer<typeof frameSpecSchema>;

const requestFields = {
  title: z
    .string({ error: 'Give the request a title.' })
    .trim()
    .min(3, { error: 'Give the request a title of at least 3 characters.' })
    .max(120, { error: 'Keep the title under 120 characters.' }),
  wheels: z
    .array(wheelSpecSchema, { error: 'Describe at least one wheel.' })
    .min(1, { error: 'Describe at least one wheel.' })
    .max(2, { error: 'A request covers one wheel or a front and rear pair.' }),
  frame: frameSpecSchema,
  zip: zipSchema,
  delivery: z.enum(['ship', 'pickup'], { error: 'Choose shipping or local pickup.' }),
  neededBy: z.iso.date({ error: 'Enter the needed-by date as YYYY-MM-DD.' }),
  budgetCents: z
    .number({ error: 'Budget must be an amount in cents.' })
    .int({ error: 'Budget must be whole cents.' })
    .min(100, { error: 'Budget must be at least $1.' })
    .max(MAX_BUDGET_CENTS, { error: `Budget must be at most $${(MAX_BUDGET_CENTS / 100).toLocaleString('en-US')}.` }),
  notes: z.string().trim().max(2000, { error: 'Keep the notes under 2000 characters.' }).default(''),
};

type RequestShape = { wheels: WheelSpec[]; frame: FrameSpec; neededBy: string };

/** Checks across fields, and the engine's own checks (hub drilling, hub position, tire on rim) per wheel. */
function refineRequest(value: RequestShape, ctx: z.RefinementCtx): void {
  const positions = value.wheels.map((w) => w.position);
  if (new Set(positions).size !== positions.length) {
    ctx.addIssue({ code: 'custom', path: ['wheels'], message: 'A pair is one front and one rear wheel.' });
  }
  if (value.neededBy <= todayUtc()) {
    ctx.addIssue({ code: 'custom', path: ['neededBy'], message: 'The needed-by date must be in the future.' });
  } else if (new Date(value.neededBy).getTime() - Date.now() > 2 * 365 * DAY_MS) {
    ctx.addIssue({ code: 'custom', path: ['neededBy'], message: 'The needed-by date must be within two years.' });
  }
  const seen = new Set<string>();
  value.wheels.forEach((wheel, i) => {
    const parsed = fitRequestSchema.safeParse(toFitInput(wheel, value.frame));
    if (parsed.success) return;
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0] ?? '');
      const mapped = FIT_FIELD_TO_REQUEST_PATH[field];
      const path = mapped ? (mapped[0] === 'frame' ? mapped : ['wheels', i, ...mapped]) : ['wheels', i];
      const key = `${path.join('.')}|${issue.message}`;
      if (seen.has(key)) continue; // frame problems would repeat once per wheel
      seen.add(key);
      ctx.addIssue({ code: 'custom', path, message: issue.message });
    }
  });
}

/** A wheel request: one wheel or a pair, the frame, where and when, and the budget. */
export const requestInputSchema = z.object(requestFields).superRefine(refineRequest);
export type RequestInput = z.infer<typeof requestInputSchema>;
/** What a form holds before parsing (notes optional). */
export type RequestFormValues = z.input<typeof requestInputSchema>;

/** POST /api/requests: the request, saved as a draft or published straight away. */
export const createRequestBodySchema = z
  .object({ ...requestFields, publish: z.boolean({ error: 'publish must be true or false.' }).default(false) })
  .superRefine(refineRequest);

const validUntilSchema = z
  .union([z.iso.date(), z.iso.datetime({ offset: true })], { error: 'Enter the valid-until date as YYYY-MM-DD.' })
  .refine((v) => endOfDayUtc(v).getTime() > Date.now(), { error: 'The valid-until date must be in the future.' })
  .refine((v) => endOfDayUtc(v).getTime() - Date.now() <= 180 * DAY_MS, { error: 'A bid can stay valid for at most 180 days.' });

/** A builder's change to one wheel of the request; only the fields that change. */
export const wheelChangeSchema = wheelSpecSchema.partial().extend({ position: wheelPositionSchema });

export const proposedChangeSchema = z.object(
  {
    description: z
      .string({ error: 'Describe the change you propose.' })
      .trim()
      .min(3, { error: 'Describe the change you propose.' })
      .max(1000, { error: 'Keep the description under 1000 characters.' }),
    wheels: z.array(wheelChangeSchema).max(2, { error: 'A change covers at most the two wheels of the request.' }).default([]),
  },
  { error: 'Describe the change you propose.' },
);
export type ProposedChange = z.infer<typeof proposedChangeSchema>;

/** A bid: price as line items, lead time, how long it stands, a message, and an optional spec change. */
export const bidInputSchema = z.object({
  partsCents: cents('Parts', MAX_LINE_CENTS),
  labourCents: cents('Labour', MAX_LINE_CENTS),
  finishCents: cents('Finish', MAX_LINE_CENTS),
  shippingCents: cents('Shipping', MAX_LINE_CENTS),
  leadTimeDays: wholeNumber('Lead time (days)', 1, 365),
  validUntil: validUntilSchema,
  message: z.string().trim().max(2000, { error: 'Keep the message under 2000 characters.' }).default(''),
  proposedChange: proposedChangeSchema.nullish(),
});
export type BidInput = z.infer<typeof bidInputSchema>;
export type BidFormValues = z.input<typeof bidInputSchema>;

export const acceptBidSchema = z.object({ bidId: z.uuid({ error: 'Choose a bid to accept.' }) });

export const messageInputSchema = z.object({
  body: z
    .string({ error: 'Write a message.' })
    .trim()
    .min(1, { error: 'Write a message.' })
    .max(4000, { error: 'Keep the message under 4000 characters.' }),
});

/** Rim width classes the trade sells, in inches (2, 2½, 3, 4 and 5 inch). */
export const RIM_WIDTH_CLASSES_IN = [2, 2.5, 3, 4, 5] as const;

const listOf = <T extends z.ZodType>(item: T, label: string) => z.array(item).max(20, { error: `List at most 20 ${label}.` });

export const capabilitiesSchema = z.object(
  {
    rimWidthsIn: listOf(z.number().min(1, { error: 'Rim widths are 1 to 6 inches.' }).max(6, { error: 'Rim widths are 1 to 6 inches.' }), 'rim widths').default([]),
    diametersIn: listOf(z.literal(NOMINAL_DIAMETERS_IN, { error: `Wheel sizes are ${NOMINAL_DIAMETERS_IN.join(', ')} inches.` }), 'wheel sizes').default([]),
    gauges: listOf(z.literal(SPOKE_GAUGES, { error: `Spoke gauges are ${SPOKE_GAUGES[0]} to ${SPOKE_GAUGES[SPOKE_GAUGES.length - 1]}.` }), 'gauges').default([]),
    spokeCounts: listOf(wholeNumber('Spoke count', 12, 144), 'spoke counts').default([]),
    hubDrilling: z.boolean({ error: 'Hub drilling must be yes or no.' }).default(false),
    finishes: listOf(z.string().trim().min(1, { error: 'Name the finish.' }).max(40, { error: 'Keep each finish under 40 characters.' }), 'finishes').default([]),
  },
  { error: 'List what the shop builds.' },
);
export type Capabilities = z.infer<typeof capabilitiesSchema>;

export const shopSettingsSchema = z.object({
  capabilities: capabilitiesSchema,
  labourRateCentsPerHour: cents('Labour rate', 100_000).nullable(),
  zip: zipSchema,
  buildsAtOnce: wholeNumber('Builds at once', 1, 100),
});
export type ShopSettingsInput = z.infer<typeof shopSettingsSchema>;
/** PATCH /api/shop/settings: any subset of the settings. */
export const shopSettingsPatchSchema = shopSettingsSchema.partial();

const flag = z
  .enum(['on', 'off', 'true', 'false', '1', '0'], { error: 'Use on or off.' })
  .transform((v) => v === 'on' || v === 'true' || v === '1');
const optionalNumber = (schema: z.ZodNumber) => z.coerce.number({ error: 'Must be a number.' }).pipe(schema).optional();

export const BOARD_SORTS = ['newest', 'neededBy', 'budget', 'distance'] as const;
export type BoardSort = (typeof BOARD_SORTS)[number];

/** GET /api/board query string. Everything optional; the shop's capability filter is on unless turned off. */
export const boardQuerySchema = z
  .object({
    diameterIn: optionalNumber(z.number().refine((v) => (NOMINAL_DIAMETERS_IN as readonly number[]).includes(v), { error: `Wheel size must be one of ${NOMINAL_DIAMETERS_IN.join(', ')}.` })),
    rimWidthIn: optionalNumber(z.number().min(1, { error: 'Rim width is 1 to 6 inches.' }).max(6, { error: 'Rim width is 1 to 6 inches.' })),
    gauge: optionalNumber(wholeNumber('Spoke gauge', 8, 15)),
    spokes: optionalNumber(wholeNumber('Spoke count', 12, 144)),
    maxMiles: optionalNumber(z.number().positive({ error: 'Distance must be more than 0 miles.' }).max(5000, { error: 'Distance must be at most 5000 miles.' })),
    budgetMinCents: optionalNumber(cents('Lowest budget', MAX_BUDGET_CENTS)),
    budgetMaxCents: optionalNumber(cents('Highest budget', MAX_BUDGET_CENTS)),
    neededByFrom: z.iso.date({ error: 'Use YYYY-MM-DD.' }).optional(),
    neededByTo: z.iso.date({ error: 'Use YYYY-MM-DD.' }).optional(),
    sort: z.enum(BOARD_SORTS, { error: `Sort by ${BOARD_SORTS.join(', ')}.` }).default('newest'),
    order: z.enum(['asc', 'desc'], { error: 'Order is asc or desc.' }).optional(),
    capabilityFilter: flag.default(true),
    limit: z.coerce.number().pipe(wholeNumber('Page size', 1, 100)).default(25),
    cursor: z.string().max(500).optional(),
  })
  .refine((q) => q.budgetMinCents === undefined || q.budgetMaxCents === undefined || q.budgetMinCents <= q.budgetMaxCents, {
    path: ['budgetMaxCents'],
    error: 'The highest budget must not be below the lowest.',
  });
export type BoardQuery = z.infer<typeof boardQuerySchema>;

/** GET /api/bids query string. */
export const shopBidsQuerySchema = z.object({
  status: z.enum(['live', 'accepted', 'declined', 'withdrawn', 'expired'], { error: 'Unknown bid status.' }).optional(),
});
