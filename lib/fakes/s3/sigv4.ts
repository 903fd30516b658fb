// Signature Version 4 checks for the local S3 stand-in. s3rver accepts any V4 signature from a known
// key, so without this a presigned URL could be replayed against another key, past its expiry, or with
// a different content type or length; the real service refuses all of those, and so do we.
import crypto from 'node:crypto';
import type { IncomingMessage } from 'node:http';

export interface Credentials {
  accessKeyId: string;
  secretAccessKey: string;
}

export type Verdict = { ok: true } | { ok: false; code: string; message: string };

const deny = (code: string, message: string): Verdict => ({ ok: false, code, message });

// RFC 3986 unreserved characters stay; everything else is percent-encoded, as the AWS signer does.
function encodeStrict(value: string): string {
  return encodeURIComponent(value).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

function safeDecode(value: string): string {
  try {
    return decodeURIComponent(value);
  } catch {
    return value;
  }
}

function parseQuery(raw: string): [string, string][] {
  if (!raw) return [];
  return raw
    .split('&')
    .filter(Boolean)
    .map((part) => {
      const eq = part.indexOf('=');
      return eq < 0 ? [safeDecode(part), ''] : [safeDecode(part.slice(0, eq)), safeDecode(part.slice(eq + 1))];
    });
}

function canonicalQuery(pairs: [string, string][]): string {
  return pairs
    .map(([k, v]) => [encodeStrict(k), encodeStrict(v)] as const)
    .sort(([ak, av], [bk, bv]) => (ak === bk ? (av < bv ? -1 : av > bv ? 1 : 0) : ak < bk ? -1 : 1))
    .map(([k, v]) => `${k}=${v}`)
    .join('&');
}

function headerValue(req: IncomingMessage, name: string): string | undefined {
  const value = req.headers[name];
  if (value === undefined) return undefined;
  return (Array.isArray(value) ? value.join(',') : value).trim().replace(/\s+/g, ' ');
}

const hmac = (key: crypto.BinaryLike, data: string) => crypto.createHmac('sha256', key).update(data).digest();
const sha256Hex = (data: string) => crypto.createHash('sha256').update(data).digest('hex');

function signature(secret: string, scope: string[], amzDate: string, canonicalRequest: string): string {
  const [date, region, service, terminator] = scope;
  let key: Buffer = hmac(`AWS4${secret}`, date);
  key = hmac(key, region);
  key = hmac(key, service);
  key = hmac(key, terminator);
  const stringToSign = ['AWS4-HMAC-SHA256', amzDate, scope.join('/'), sha256Hex(canonicalRequest)].join('\n');
  return crypto.createHmac('sha256', key).update(stringToSign).digest('hex');
}

function sameHex(a: string, b: string): boolean {
  return a.length === b.length && crypto.timingSafeEqual(Buffer.from(a), Buffer.from(b));
}

function parseAmzDate(value: string): number {
  const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(value);
  return m ? Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) : NaN;
}

interface Parts {
  credential: string;
  signedHeaders: string;
  provided: string;
  amzDate: string;
  payloadHash: string;
  queryPairs: [string, string][];
  expiresSeconds?: number;
}

function presignedParts(req: IncomingMessage, pairs: [string, string][]): Parts | Verdict {
  const get = (name: string) => pairs.find(([k]) => k === name)?.[1];
  const credential = get('X-Amz-Credential');
  const signedHeaders = get('X-Amz-SignedHeaders');
  const provided = get('X-Amz-Signature');
  const amzDate = get('X-Amz-Date');
  const expires = Number(get('X-Amz-Expires'));
  if (get('X-Amz-Algorithm') !== 'AWS4-HMAC-SHA256' || !credential || !signedHeaders || !provided || !amzDate || !Number.isInteger(expires)) {
    return deny('AuthorizationQueryParametersError', 'The presigned URL is missing a required parameter.');
  }
  return {
    credential,
    signedHeaders,
    provided,
    amzDate,
    payloadHash: 'UNSIGNED-PAYLOAD',
    queryPairs: pairs.filter(([k]) => k !== 'X-Amz-Signature'),
    expiresSeconds: expires,
  };
}

function headerParts(req: IncomingMessage, pairs: [string, string][]): Parts | Verdict {
  const auth = headerValue(req, 'authorization') ?? '';
  const m = /^AWS4-HMAC-SHA256 Credential=([^,]+), ?SignedHeaders=([^,]+), ?Signature=([0-9a-f]+)$/.exec(auth);
  const amzDate = headerValue(req, 'x-amz-date');
  const payloadHash = headerValue(req, 'x-amz-content-sha256');
  if (!m || !amzDate || !payloadHash) return deny('AuthorizationHeaderMalformed', 'The authorization header is malformed.');
  return { credential: m[1], signedHeaders: m[2], provided: m[3], amzDate, payloadHash, queryPairs: pairs };
}

/** Checks a request's V4 signature (header or presigned query) against the one set of credentials. */
export function verifySignature(req: IncomingMessage, credentials: Credentials, now = Date.now()): Verdict {
  const url = req.url ?? '/';
  const q = url.indexOf('?');
  const rawPath = q < 0 ? url : url.slice(0, q);
  const pairs = parseQuery(q < 0 ? '' : url.slice(q + 1));
  const presigned = pairs.some(([k]) => k === 'X-Amz-Algorithm');
  if (!presigned && !req.headers.authorization) return deny('AccessDenied', 'Anonymous access is not allowed.');

  const parts = presigned ? presignedParts(req, pairs) : headerParts(req, pairs);
  if ('ok' in parts) return parts;

  const [accessKeyId, ...scope] = parts.credential.split('/');
  if (accessKeyId !== credentials.accessKeyId) return deny('InvalidAccessKeyId', 'The access key does not exist in our records.');
  if (scope.length !== 4 || scope[3] !== 'aws4_request' || scope[0] !== parts.amzDate.slice(0, 8)) {
    return deny('AuthorizationQueryParametersError', 'The credential scope is malformed.');
  }
  const signedAt = parseAmzDate(parts.amzDate);
  if (Number.isNaN(signedAt)) return deny('AccessDenied', 'The signing date is malformed.');
  if (parts.expiresSeconds !== undefined) {
    if (parts.expiresSeconds < 1 || parts.expiresSeconds > 604_800) return deny('AuthorizationQueryParametersError', 'X-Amz-Expires is out of range.');
    if (now > signedAt + parts.expiresSeconds * 1000) return deny('AccessDenied', 'Request has expired');
    if (signedAt > now + 15 * 60_000) return deny('AccessDenied', 'The signing date is in the future.');
  } else if (Math.abs(now - signedAt) > 15 * 60_000) {
    return deny('RequestTimeTooSkewed', 'The difference between the request time and the server time is too large.');
  }

  const names = parts.signedHeaders.split(';');
  if (!names.includes('host')) return deny('AccessDenied', 'The host header must be signed.');
  const canonicalHeaders = names.map((name) => `${name}:${headerValue(req, name) ?? ''}\n`).join('');
  const canonicalRequest = [req.method ?? 'GET', rawPath, canonicalQuery(parts.queryPairs), canonicalHeaders, parts.signedHeaders, parts.payloadHash].join('\n');
  const expected = signature(credentials.secretAccessKey, scope, parts.amzDate, canonicalRequest);
  if (!sameHex(expected, parts.provided)) {
    return deny('SignatureDoesNotMatch', 'The request signature we calculated does not match the signature you provided.');
  }
  return { ok: true };
}
