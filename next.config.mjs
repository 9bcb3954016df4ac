/**
 * Security headers for every response. The Content-Security-Policy allows scripts only
 * from the app itself; 'unsafe-inline' stays for scripts because Next's production pages
 * carry inline bootstrap scripts (the React Server Components payload) and a static
 * header cannot carry a per-request nonce. Development adds 'unsafe-eval' (React's
 * refresh runtime). Frames are refused (frame-ancestors 'none' and X-Frame-Options), types
 * are never sniffed, referrers never leave the origin (invitation links carry tokens),
 * and the browser features Tareline does not use are switched off.
 */
const dev = process.env.NODE_ENV !== "production";
const contentSecurityPolicy = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  `connect-src 'self'${dev ? " ws: wss:" : ""}`,
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

export const securityHeaders = [
  { key: "Content-Security-Policy", value: contentSecurityPolicy },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), browsing-topics=()" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // `npm test` builds into its own folder so it never disturbs a running `npm start`.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  // Sequelize and pdfmake load optional dependencies dynamically; bundling them breaks the build.
  // pg-boss (the job queue) runs on the same pg driver, so it stays outside the bundle too.
  serverExternalPackages: ["sequelize", "pdfmake", "pg", "pg-hstore", "pg-boss"],
  // `npm test` type-checks the whole project with tsc first; the build does not repeat it.
  typescript: { ignoreBuildErrors: true },
  poweredByHeader: false,
  reactStrictMode: true,
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};

export default nextConfig;
