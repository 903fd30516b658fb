// The page policy: everything from our own origin. Scripts must carry the per-request nonce (Next puts it
// on its own scripts when it finds it in the request's policy header); 'strict-dynamic' lets those scripts
// load the chunks they need. Styles allow inline: React style attributes, next/font and the map library
// set them. Photos are sent by the browser straight to storage, so its origin is allowed to connect.
export interface PolicyOptions {
  nonce: string;
  /** next dev evaluates code for fast refresh; never in production. */
  development?: boolean;
  /** Extra origins the browser talks to with fetch/XHR (the photo store's upload endpoint). */
  connectOrigins?: string[];
}

export function contentSecurityPolicy({ nonce, development = false, connectOrigins = [] }: PolicyOptions): string {
  const directives: Record<string, string[]> = {
    'default-src': ["'self'"],
    'script-src': ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(development ? ["'unsafe-eval'"] : [])],
    'style-src': ["'self'", "'unsafe-inline'"],
    'img-src': ["'self'", 'data:', 'blob:'],
    'font-src': ["'self'", 'data:'],
    'connect-src': ["'self'", ...connectOrigins, ...(development ? ['ws:'] : [])],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    'form-action': ["'self'"],
    'frame-ancestors': ["'none'"],
    'worker-src': ["'self'", 'blob:'],
    'manifest-src': ["'self'"],
  };
  return Object.entries(directives)
    .map(([name, values]) => `${name} ${[...new Set(values)].join(' ')}`)
    .join('; ');
}

/** A fresh nonce: 128 random bits, base64. */
export function makeNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Buffer.from(bytes).toString('base64');
}

/** The origin of a URL, or null when it is not one. */
export function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}
