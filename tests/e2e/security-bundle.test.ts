// No secret reaches the browser: every file the build serves to clients is scanned for keys, connection
// strings and the settings' local defaults (which would mean the server settings module was bundled).
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { LOCAL_PAYMENTS } from '@/lib/payments/localDefaults';

const distDir = path.resolve(process.env.NEXT_DIST_DIR ?? '.next-test');

function files(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}

// Values that must never appear in client code, with what each would mean.
const FORBIDDEN: { pattern: RegExp; what: string }[] = [
  { pattern: /sk_(test|live)_[A-Za-z0-9]{6,}/, what: 'a payments secret key' },
  { pattern: /rk_(test|live)_[A-Za-z0-9]{6,}/, what: 'a payments restricted key' },
  { pattern: /whsec_[A-Za-z0-9_]{6,}/, what: 'a webhook signing secret' },
  { pattern: new RegExp(LOCAL_PAYMENTS.secretKey), what: 'the local payments key' },
  { pattern: /postgres(ql)?:\/\/[^\s"'`]+/, what: 'a database connection string' },
  { pattern: /DATABASE_URL/, what: 'the database setting' },
  { pattern: /AUTH_SECRET|NEXTAUTH_SECRET/, what: 'the session signing setting' },
  { pattern: /lacewright-local-development-secret/, what: 'the local session signing secret' },
  { pattern: /test-secret-for-the-browser-suite/, what: "the test suite's session secret" },
  { pattern: /S3_SECRET_ACCESS_KEY|S3_ACCESS_KEY_ID/, what: 'the storage key settings' },
  { pattern: /AKIA[0-9A-Z]{16}/, what: 'a cloud access key id' },
  { pattern: /-----BEGIN [A-Z ]*PRIVATE KEY-----/, what: 'a private key' },
  { pattern: /password_hash|\$2[aby]\$\d\d\$/, what: 'a password hash or its column' },
];

describe('the client bundle', () => {
  const clientFiles = files(path.join(distDir, 'static')).filter((f) => /\.(js|mjs|json|map|txt|html|css)$/.test(f));

  it('exists (the build ran)', () => {
    expect(clientFiles.filter((f) => f.endsWith('.js')).length).toBeGreaterThan(5);
  });

  it('holds no secret, key, connection string or server setting', () => {
    const found: string[] = [];
    for (const file of clientFiles) {
      const text = fs.readFileSync(file, 'utf8');
      for (const { pattern, what } of FORBIDDEN) {
        const m = text.match(pattern);
        if (m) found.push(`${path.relative(distDir, file)}: ${what} (${m[0].slice(0, 40)})`);
      }
    }
    expect(found).toEqual([]);
  });
});
