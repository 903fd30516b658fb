// JSON over fetch for the money pages: a non-2xx answer becomes a PaymentsApiError carrying the server's
// plain message (409 wrong step, 503 payment service down …) and its field messages.
export class PaymentsApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fieldErrors: Record<string, string[]> = {},
  ) {
    super(message);
    this.name = 'PaymentsApiError';
  }
}

export async function callApi<T>(url: string, init: { method?: 'GET' | 'POST'; json?: unknown } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method: init.method ?? 'GET',
      headers: { accept: 'application/json', ...(init.json !== undefined ? { 'content-type': 'application/json' } : {}) },
      body: init.json !== undefined ? JSON.stringify(init.json) : undefined,
      credentials: 'same-origin',
      cache: 'no-store',
    });
  } catch {
    throw new PaymentsApiError(0, 'We could not reach Lacewright. Check your connection and try again; nothing was changed.');
  }
  const body = (await res.json().catch(() => null)) as { error?: string; fieldErrors?: Record<string, string[]> } | null;
  if (!res.ok) {
    const fallback = res.status === 401 ? 'Your session has ended; sign in again.' : `Something went wrong (${res.status}). Try again.`;
    throw new PaymentsApiError(res.status, body?.error ?? fallback, body?.fieldErrors ?? {});
  }
  return body as T;
}

const stamp = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const dayOnly = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' });

/** Times are stored and shown in UTC, said so beside them. */
export const formatWhen = (iso: string | null): string => (iso ? `${stamp.format(new Date(iso))} UTC` : '');
export const formatDay = (iso: string | null): string => (iso ? dayOnly.format(new Date(iso)) : '');
