// A local S3-compatible store on loopback: s3rver behind a strict Signature V4 check, one bucket made
// at start with CORS for the app's origins so browsers can PUT to presigned URLs.
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import S3rver from 's3rver';
import { verifySignature, type Credentials } from './sigv4';

export interface S3FakeOptions {
  host?: string;
  /** 0 picks a free port. */
  port: number;
  /** Where objects are kept between restarts. */
  directory: string;
  bucket: string;
  /** Origins allowed to PUT and GET from a browser (the app's own). */
  allowedOrigins: string[];
  credentials?: Credentials;
  /** Refused requests are always reported here; every request too with `logRequests`. */
  log?: (line: string) => void;
  logRequests?: boolean;
}

export interface S3Fake {
  url: string;
  port: number;
  bucket: string;
  credentials: Credentials;
  close(): Promise<void>;
}

// s3rver's built-in key pair; the SDK client uses the same pair.
export const S3_FAKE_CREDENTIALS: Credentials = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

const xmlEscape = (s: string) => s.replace(/[<>&'"]/g, (c) => `&#${c.charCodeAt(0)};`);

function corsXml(origins: string[]): string {
  const allowed = origins.map((o) => `<AllowedOrigin>${xmlEscape(o)}</AllowedOrigin>`).join('');
  return (
    '<CORSConfiguration><CORSRule>' +
    allowed +
    '<AllowedMethod>PUT</AllowedMethod><AllowedMethod>GET</AllowedMethod><AllowedMethod>HEAD</AllowedMethod>' +
    '<AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>600</MaxAgeSeconds>' +
    '</CORSRule></CORSConfiguration>'
  );
}

export async function startS3Fake(o: S3FakeOptions): Promise<S3Fake> {
  const host = o.host ?? '127.0.0.1';
  const credentials = o.credentials ?? S3_FAKE_CREDENTIALS;
  fs.mkdirSync(o.directory, { recursive: true });
  const store = new S3rver({
    address: host,
    port: o.port,
    directory: o.directory,
    silent: true,
    vhostBuckets: false,
    configureBuckets: [{ name: o.bucket, configs: [corsXml(o.allowedOrigins)] }],
  });
  await store.configureBuckets();
  const handle = store.callback();

  const server = http.createServer((req, res) => {
    if (req.method === 'GET' && req.url === '/__fake/health') {
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ ok: true, bucket: o.bucket }));
      return;
    }
    // CORS preflights carry no signature; s3rver answers them from the bucket's CORS rules.
    if (req.method !== 'OPTIONS') {
      const verdict = verifySignature(req, credentials);
      if (!verdict.ok) {
        o.log?.(`${req.method} ${req.url?.split('?')[0]} refused: ${verdict.code}`);
        const origin = req.headers.origin;
        const headers: http.OutgoingHttpHeaders = { 'content-type': 'application/xml' };
        // So a browser can read why its upload was refused instead of seeing a bare network error.
        if (origin && o.allowedOrigins.includes(origin)) Object.assign(headers, { 'access-control-allow-origin': origin, vary: 'Origin' });
        res.writeHead(403, headers).end(`<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${verdict.code}</Code><Message>${xmlEscape(verdict.message)}</Message></Error>`);
        req.resume();
        return;
      }
    }
    if (o.log && o.logRequests) res.on('finish', () => o.log?.(`${req.method} ${req.url?.split('?')[0]} ${res.statusCode}`));
    handle(req, res);
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(o.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://${host}:${port}`,
    port,
    bucket: o.bucket,
    credentials,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => {
          store.logger?.close();
          resolve();
        });
      }),
  };
}

/** The app's origin and its loopback twin (localhost and 127.0.0.1 are different origins to a browser). */
export function originsFor(appUrl: string): string[] {
  const url = new URL(appUrl);
  const twins = [url.origin];
  if (url.hostname === 'localhost') twins.push(url.origin.replace('//localhost', '//127.0.0.1'));
  if (url.hostname === '127.0.0.1') twins.push(url.origin.replace('//127.0.0.1', '//localhost'));
  return twins;
}
