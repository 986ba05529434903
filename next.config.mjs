/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // Database drivers and the worker pool run as plain Node modules, never bundled.
  serverExternalPackages: ['sequelize', 'pg', 'pg-hstore', 'piscina', 'mathjs', 'smtp-server', 'nodemailer', 'pg-boss', '@react-pdf/renderer'],
  typedRoutes: false,
  // The test run builds into a folder of its own so a running `npm start` is never disturbed.
  distDir: process.env.DENUDATA_DIST_DIR || '.next',
};

export default nextConfig;
