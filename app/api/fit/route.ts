import { Invalid } from '@/lib/errors';
import { route } from '@/lib/http/route';
import { computeFit, fitRequestSchema, WheelInputError } from '@/lib/wheel';

// The fitment check: one wheel and its frame in, verdict, spoke lengths, cost and geometry out.
export const POST = route({ access: 'public', body: fitRequestSchema }, async ({ body }) => {
  try {
    return computeFit(body);
  } catch (err) {
    if (err instanceof WheelInputError) throw new Invalid(err.message, err.fieldErrors);
    throw err;
  }
});
