// Inputs for one wheel in one frame, shared by the engine, POST /api/fit and the /fit form. Lengths in mm.

import { z } from 'zod';
import { DEFAULT_HUB_ID, HUB_IDS, cogFor, hubById, type HubId } from './catalogue';
import { FINISHES } from './priceBook';
import { BSD_BY_NOMINAL_IN, NOMINAL_DIAMETERS_IN } from './standards';

const mm = (label: string, min: number, max: number) =>
  z
    .number({ error: `${label} must be a number of millimetres` })
    .refine(Number.isFinite, { error: `${label} must be a finite number` })
    .refine((v) => v >= min && v <= max, { error: `${label} must be between ${min} and ${max} mm` });

const whole = (label: string, min: number, max: number) =>
  z
    .number({ error: `${label} must be a number` })
    .int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` })
    .max(max, { error: `${label} must be at most ${max}` });

export const wheelPositionSchema = z.enum(['front', 'rear'], { error: 'Wheel position must be front or rear' });
export const nominalDiameterSchema = z.literal(NOMINAL_DIAMETERS_IN, {
  error: `Wheel size must be one of ${NOMINAL_DIAMETERS_IN.join(', ')} inches`,
});
export const hubIdSchema = z.enum(HUB_IDS, { error: `Hub must be one of ${HUB_IDS.join(', ')}` });
export const cogKindSchema = z.enum(['standard', 'offset'], { error: 'Cog must be standard or offset' });
export const finishSchema = z.enum(FINISHES, { error: `Finish must be one of ${FINISHES.join(', ')}` });

const fitRequestObject = z.object({
  position: wheelPositionSchema.default('rear'),
  nominalDiameterIn: nominalDiameterSchema.default(26),
  rimWidthMm: mm('Rim width', 19, 150).default(80),
  tireWidthMm: mm('Tire width', 20, 160).default(76),
  /** A measured ERD; left out, the engine estimates it from the bead seat. */
  erdMm: mm('ERD', 200, 640).optional(),
  spokes: whole('Spoke count', 12, 144).default(36),
  spokeGauge: whole('Spoke gauge', 8, 15).default(14),
  /** 0 means radial. */
  crosses: whole('Crosses', 0, 12).default(3),
  /** Left out, the catalogue's usual hub for the position. */
  hubId: hubIdSchema.optional(),
  cog: cogKindSchema.default('standard'),
  chainringTeeth: whole('Chainring teeth', 20, 60).default(36),
  cogTeeth: whole('Cog teeth', 12, 30).default(18),
  frameRearSpacingMm: mm('Frame rear spacing', 100, 200).default(120),
  forkSpacingMm: mm('Fork spacing', 90, 150).default(100),
  bbShellWidthMm: mm('Bottom-bracket shell width', 60, 130).default(68),
  /** Left out, the engine picks the spindle the shell and wheel call for. */
  spindleLengthMm: mm('Spindle length', 90, 200).optional(),
  chainstayLengthMm: mm('Chainstay length', 300, 700).default(460),
  finish: finishSchema.default('bare'),
});

/** One wheel and the frame it goes in, with defaults for a 26-inch, 3-inch-wide rear wheel on a 3-speed hub. */
export const fitRequestSchema = fitRequestObject
  .transform((v) => ({ ...v, hubId: (v.hubId ?? DEFAULT_HUB_ID[v.position]) as HubId }))
  .superRefine((v, ctx) => {
    const hub = hubById(v.hubId);
    if (hub.position !== v.position) {
      ctx.addIssue({ code: 'custom', path: ['hubId'], message: `The ${hub.label.toLowerCase()} is a ${hub.position} hub; choose a ${v.position} hub` });
    }
    if (!hub.drillings.some((d) => d.spokes === v.spokes)) {
      ctx.addIssue({
        code: 'custom',
        path: ['spokes'],
        message: `The ${hub.label.toLowerCase()} comes drilled for ${hub.drillings.map((d) => d.spokes).join(', ')} spokes`,
      });
    }
    if (v.position === 'rear' && v.cog === 'offset' && !cogFor(hub, 'offset')) {
      ctx.addIssue({ code: 'custom', path: ['cog'], message: `No offset cog is made for the ${hub.label.toLowerCase()}` });
    }
    const bsd = BSD_BY_NOMINAL_IN[v.nominalDiameterIn];
    if (v.erdMm !== undefined && (v.erdMm >= bsd || v.erdMm < bsd - 80)) {
      ctx.addIssue({ code: 'custom', path: ['erdMm'], message: `ERD must be below the ${bsd} mm bead seat and within 80 mm of it` });
    }
    if (v.tireWidthMm < v.rimWidthMm * 0.6) {
      ctx.addIssue({ code: 'custom', path: ['tireWidthMm'], message: `A ${v.tireWidthMm} mm tire is too narrow to mount on a ${v.rimWidthMm} mm rim` });
    }
  });

/** What a form or client sends (defaults optional). */
export type FitRequestInput = z.input<typeof fitRequestSchema>;
/** What the engine works with after parsing (defaults filled, hub chosen). */
export type FitRequest = z.output<typeof fitRequestSchema>;

/** Field-by-field messages for a 400 response or a form. */
export function fitRequestFieldErrors(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.join('.') : '_';
    (out[key] ??= []).push(issue.message);
  }
  return out;
}
