import createNextIntlPlugin from 'next-intl/plugin';

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Parallel test runs (VINEWARD_SLOT) build into their own folders.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  // knex pulls optional drivers the bundler cannot resolve; load it from node_modules at run time.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'rate-limiter-flexible'],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default createNextIntlPlugin('./i18n/request.ts')(nextConfig);
