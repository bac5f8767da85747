import createNextIntlPlugin from 'next-intl/plugin';

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Parallel test runs (VINEWARD_SLOT) build into their own folders.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  // Loaded from node_modules at run time: knex pulls optional drivers the bundler cannot resolve,
  // and exifr picks its Node build (fs, zlib) only when it is not bundled.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'rate-limiter-flexible', 'exifr'],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default createNextIntlPlugin('./i18n/request.ts')(nextConfig);
