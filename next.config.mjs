/** @type {import('next').NextConfig} */
const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
  {
    key: "Content-Security-Policy",
    // pdf.js runs its worker from our own origin; no third-party origins anywhere.
    value: [
      "default-src 'self'",
      "script-src 'self' 'unsafe-inline'",
      "style-src 'self' 'unsafe-inline'",
      "img-src 'self' data: blob:",
      "font-src 'self'",
      "worker-src 'self' blob:",
      "connect-src 'self'",
      "frame-ancestors 'none'",
      "form-action 'self'",
      "base-uri 'self'",
      "object-src 'none'",
    ].join("; "),
  },
];

const nextConfig = {
  reactStrictMode: true,
  // Parallel builds (several developers or instances on one machine) each get their own folder.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  // The test command type-checks the whole tree with tsc as its own step; the build need not repeat it.
  typescript: { ignoreBuildErrors: true },
  serverExternalPackages: ["pdfjs-dist", "mysql2", "nodemailer"],
  experimental: { serverActions: { bodySizeLimit: "2mb" } },
  async headers() {
    // Served documents set their own, stricter CSP (sandbox) in the route handler.
    return [
      { source: "/((?!api/documents/).*)", headers: securityHeaders },
      { source: "/api/documents/:path*", headers: securityHeaders.filter((h) => h.key !== "Content-Security-Policy") },
    ];
  },
};

export default nextConfig;
