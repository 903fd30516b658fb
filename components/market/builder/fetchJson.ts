// JSON over fetch for client components: a non-2xx answer becomes an ApiError with the server's
// plain message and its field messages (400), so forms can put them under the right fields.
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fieldErrors: Record<string, string[]> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export async function fetchJson<T>(url: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, ...rest } = init;
  const headers = new Headers(rest.headers);
  headers.set('accept', 'application/json');
  if (json !== undefined) headers.set('content-type', 'application/json');
  let res: Response;
  try {
    res = await fetch(url, { ...rest, headers, body: json !== undefined ? JSON.stringify(json) : rest.body, credentials: 'same-origin' });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'We could not reach Lacewright. Check your connection and try again.');
  }
  const body = (await res.json().catch(() => null)) as (T & { error?: string; fieldErrors?: Record<string, string[]> }) | null;
  if (!res.ok) {
    const fallback = res.status === 401 ? 'Your session has ended; sign in again.' : `Something went wrong (${res.status}). Try again.`;
    throw new ApiError(res.status, body?.error ?? fallback, body?.fieldErrors ?? {});
  }
  return body as T;
}

/** Puts a 400's field messages on a react-hook-form form; returns the messages no field took. */
export function applyFieldErrors(
  fieldErrors: Record<string, string[]>,
  setError: (name: never, error: { type: string; message: string }) => void,
  knownFields: readonly string[],
): string[] {
  const leftover: string[] = [];
  for (const [path, messages] of Object.entries(fieldErrors)) {
    const message = messages[0];
    if (!message) continue;
    if (knownFields.includes(path)) setError(path as never, { type: 'server', message });
    else leftover.push(message);
  }
  return leftover;
}
