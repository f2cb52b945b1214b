// Pages get their Content-Security-Policy from proxy.ts, with a fresh script nonce per request.
// Route handlers answer data, not pages: this strict policy, except where a handler sets its own
// (the track-plan image keeps `default-src 'none'`, which a rule here would replace).
const apiContentSecurityPolicy = [
  "default-src 'self'",
  "script-src 'none'",
  "frame-ancestors 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "object-src 'none'",
].join('; ');

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Lets parallel work (or a second checkout) build without sharing one .next folder.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  poweredByHeader: false,
  serverExternalPackages: ['better-sqlite3', 'smtp-server', 'mailparser', 'nodemailer'],
  async headers() {
    return [
      {
        source: '/api/:path((?!layouts/[^/]+/track-plan$).*)',
        headers: [{ key: 'Content-Security-Policy', value: apiContentSecurityPolicy }],
      },
      {
        source: '/:path*',
        headers: [
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'X-Frame-Options', value: 'DENY' },
          { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
        ],
      },
    ];
  },
};

export default nextConfig;
