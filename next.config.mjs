// Headers on every answer (pages, API, static files); pages get their Content-Security-Policy, with a
// per-request nonce, from proxy.ts (lib/http/security-headers.ts). README "Headers" lists them.
const SECURITY_HEADERS = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  {
    key: 'Permissions-Policy',
    value:
      'accelerometer=(), autoplay=(), browsing-topics=(), camera=(), display-capture=(), geolocation=(), gyroscope=(), ' +
      'magnetometer=(), microphone=(), midi=(), payment=(), publickey-credentials-get=(), usb=(), xr-spatial-tracking=()',
  },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Cross-Origin-Opener-Policy', value: 'same-origin' },
];
/** API answers are data: nothing in them runs, nothing frames them. */
const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // Database drivers and the worker pool run as plain Node modules, never bundled.
  serverExternalPackages: ['sequelize', 'pg', 'pg-hstore', 'piscina', 'mathjs', 'smtp-server', 'nodemailer', 'pg-boss', '@react-pdf/renderer'],
  typedRoutes: false,
  // The expression fields use @uiw/react-codemirror with basicSetup off; the package still imports its basic
  // setup and dark theme, which would add about 30 kB compressed to the sheet page: both are replaced by
  // modules that are never used (lib/editor/*-off.ts; DEVELOPERS.md, "Editor package").
  turbopack: {
    resolveAlias: {
      '@uiw/codemirror-extensions-basic-setup': './lib/editor/basic-setup-off.ts',
      '@codemirror/theme-one-dark': './lib/editor/dark-theme-off.ts',
    },
  },
  // `DENUDATA_SOURCE_MAPS=1 next build` writes browser source maps, for scripts/bundle-composition.mjs only.
  productionBrowserSourceMaps: process.env.DENUDATA_SOURCE_MAPS === '1',
  // The test run builds into a folder of its own so a running `npm start` is never disturbed.
  distDir: process.env.DENUDATA_DIST_DIR || '.next',
  async headers() {
    return [
      { source: '/:path*', headers: SECURITY_HEADERS },
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: API_CONTENT_SECURITY_POLICY }] },
    ];
  },
};

export default nextConfig;
