// Which network a request comes from, for per-address limits. The nearest hop's view wins: the last
// X-Forwarded-For entry is the one the proxy in front of the app (or Next itself, from the socket, when
// the header is absent) wrote. Deploy behind a proxy that appends or replaces the header; a client talking
// to the app directly can choose its own entry, which is why sign-in also counts per account.
type HeaderSource = Headers | Record<string, string | string[] | undefined>;

function header(source: HeaderSource, name: string): string | undefined {
  if (source instanceof Headers) return source.get(name) ?? undefined;
  const value = source[name] ?? source[name.toLowerCase()];
  return Array.isArray(value) ? value.join(',') : value;
}

const MAX_ADDRESS_CHARS = 64;

export function clientAddress(source: HeaderSource): string {
  const forwarded = header(source, 'x-forwarded-for');
  const last = forwarded
    ?.split(',')
    .map((part) => part.trim())
    .filter(Boolean)
    .pop();
  const address = last ?? header(source, 'x-real-ip')?.trim();
  return address ? address.slice(0, MAX_ADDRESS_CHARS).replace(/^::ffff:/, '') : 'unknown';
}
