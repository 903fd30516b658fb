import { Invalid } from '@/lib/errors';
import { route } from '@/lib/http/route';
import { limitPublicApi } from '@/lib/security/limits';
import { computeFit, fitRequestSchema, WheelInputError } from '@/lib/wheel';

// The fitment check: one wheel and its frame in, verdict, spoke lengths, cost and geometry out.
export const POST = route({ access: 'public', body: fitRequestSchema }, async ({ req, body }) => {
  const limited = await limitPublicApi(req);
  if (limited) return limited;
  try {
    return computeFit(body);
  } catch (err) {
    if (err instanceof WheelInputError) throw new Invalid(err.message, err.fieldErrors);
    throw err;
  }
});
