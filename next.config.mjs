/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and Node-only packages stay out of the server bundle.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'bcryptjs', 'nodemailer', 'stripe', '@aws-sdk/client-s3'],
  // The test command builds into its own folder so it never disturbs a running start command.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
