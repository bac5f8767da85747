/** @type {import('next').NextConfig} */
const nextConfig = {
  // knex pulls optional drivers the bundler cannot resolve; load it from node_modules at run time.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'rate-limiter-flexible'],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
