import type { NextConfig } from "next";

// Security headers for every response. Next's inline bootstrap scripts need 'unsafe-inline' for scripts
// unless nonces are used; everything else is limited to our own origin.
const csp = [
  "default-src 'self'",
  "script-src 'self' 'unsafe-inline'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "media-src 'self' blob:",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

const securityHeaders = [
  { key: "Content-Security-Policy", value: csp },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), midi=(self)" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

const nextConfig: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "bullmq", "ioredis", "meyda", "wavefile", "music-metadata", "busboy", "smtp-server", "bcryptjs"],
  poweredByHeader: false,
  // The whole project is type-checked by `npm run typecheck` in the test command; the build does not repeat it.
  typescript: { ignoreBuildErrors: true },
  // Browsers still ask for /favicon.ico on pages they open without our <link rel="icon">: answer with our mark.
  async rewrites() {
    return [{ source: "/favicon.ico", destination: "/icon.svg" }];
  },
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};

export default nextConfig;
