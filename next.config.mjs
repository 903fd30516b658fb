// Sent with every answer. Pages get their content security policy (with a per-request script nonce) from
// proxy.ts; API answers get a policy under which nothing can run or be framed.
const SECURITY_HEADERS = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=(), usb=()' },
];
const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and Node-only packages stay out of the server bundle.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'bcryptjs', 'nodemailer', 'stripe', '@aws-sdk/client-s3'],
  // The test command builds into its own folder so it never disturbs a running start command.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
  async headers() {
    return [
      { source: '/:path*', headers: SECURITY_HEADERS },
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: API_CONTENT_SECURITY_POLICY }] },
    ];
  },
};

export default nextConfig;
