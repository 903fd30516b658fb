import { randomBytes } from 'node:crypto';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

/** Random base62 text; ids look like the API's (prefix + 24 characters). */
export function randomToken(length = 24): string {
  const bytes = randomBytes(length);
  let out = '';
  for (let i = 0; i < length; i++) out += ALPHABET[bytes[i] % ALPHABET.length];
  return out;
}

export function newId(prefix: string): string {
  return `${prefix}_${randomToken(24)}`;
}

export function nowSeconds(): number {
  return Math.floor(Date.now() / 1000);
}
