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
  // proxy.ts sets these on pages and /api/auth/; it skips the rest of /api/ (see there), so JSON
  // answers get them here.
  async headers() {
    return [
      {
        source: '/api/:path((?!auth/).*)',
        headers: [
          { key: 'Content-Security-Policy', value: "default-src 'none'; frame-ancestors 'none'" },
          { key: 'X-Frame-Options', value: 'DENY' },
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
        ],
      },
    ];
  },
};

export default createNextIntlPlugin('./i18n/request.ts')(nextConfig);
