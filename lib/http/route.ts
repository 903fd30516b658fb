import 'server-only';
import { z, ZodError, type ZodType } from 'zod';
import { currentUser, authorize } from '@/lib/auth/guard';
import type { Role, SessionUser } from '@/lib/auth/roles';
import { DomainError, Invalid, NotFound } from '@/lib/errors';

const MAX_BODY_BYTES = 64 * 1024;

type Access = { roles: readonly Role[] } | 'signed-in' | 'public';

interface Context<TBody, TParams> {
  req: Request;
  params: TParams;
  user: SessionUser | null;
  body: TBody;
}

/** Marks a result that should go out with a status other than 200. */
export function withStatus(status: number, data: unknown): Response {
  return Response.json(data, { status });
}

export function errorResponse(err: unknown): Response {
  if (err instanceof DomainError) {
    return Response.json({ error: err.message, ...(err.fieldErrors ? { fieldErrors: err.fieldErrors } : {}) }, { status: err.status });
  }
  if (err instanceof ZodError) {
    // A problem with the body as a whole (not an object, a field nobody may send) has no field to name.
    const { formErrors, fieldErrors } = z.flattenError(err);
    return Response.json({ error: formErrors[0] ?? 'Some fields need attention.', fieldErrors }, { status: 400 });
  }
  console.error('unhandled error in route', err);
  return Response.json({ error: 'Something went wrong on our side. Please try again.' }, { status: 500 });
}

async function readJson(req: Request): Promise<unknown> {
  const declared = Number(req.headers.get('content-length') ?? 0);
  if (declared > MAX_BODY_BYTES) throw new PayloadTooLarge();
  const text = await req.text();
  if (Buffer.byteLength(text) > MAX_BODY_BYTES) throw new PayloadTooLarge();
  if (!text) return {};
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new BadJson();
  }
  const nul = pathToNul(value);
  if (nul) throw new Invalid('Text cannot contain the NUL character (U+0000).', { [nul.join('.') || 'body']: ['Remove the NUL character (U+0000).'] });
  return value;
}

/** Where a string holding U+0000 sits in a parsed body: Postgres cannot store that character in text. */
function pathToNul(value: unknown, path: (string | number)[] = []): (string | number)[] | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null;
  if (value && typeof value === 'object') {
    for (const [key, inner] of Object.entries(value)) {
      if (key.includes('\u0000')) return [...path, key];
      const found = pathToNul(inner, [...path, key]);
      if (found) return found;
    }
  }
  return null;
}

class PayloadTooLarge extends DomainError {
  readonly status = 413;
  constructor() {
    super('The request body is too large.');
  }
}
class BadJson extends DomainError {
  readonly status = 400;
  constructor() {
    super('The request body must be JSON.');
  }
}

/**
 * Every route handler goes through here: await params, check access, parse the body with the shared
 * zod schema, call one domain function, and map its result or error to JSON.
 */
export function route<TBody = undefined, TParams = Record<string, string>>(
  options: { access: Access; body?: ZodType<TBody> },
  fn: (ctx: Context<TBody, TParams>) => Promise<unknown>,
) {
  return async (req: Request, segment: { params: Promise<TParams> }): Promise<Response> => {
    try {
      const params = (await segment?.params) ?? ({} as TParams);
      // An id or slug with a NUL character names nothing (and Postgres cannot even compare it).
      if (Object.values(params as Record<string, unknown>).some((v) => (Array.isArray(v) ? v.join('') : String(v)).includes('\u0000'))) throw new NotFound('Not found.');
      const user = options.access === 'public' ? null : await currentUser();
      if (options.access === 'signed-in') authorize(user);
      else if (options.access !== 'public') authorize(user, options.access.roles);
      const body = options.body ? options.body.parse(await readJson(req)) : (undefined as TBody);
      const result = await fn({ req, params, user, body });
      return result instanceof Response ? result : Response.json(result ?? { ok: true });
    } catch (err) {
      return errorResponse(err);
    }
  };
}
