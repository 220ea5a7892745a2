import type { NextConfig } from "next";

/** Headers for every response, pages and route handlers alike (the Content-Security-Policy is set per page, with
 * its nonce, in proxy.ts). */
const SECURITY_HEADERS = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  // For browsers that predate CSP frame-ancestors.
  { key: "X-Frame-Options", value: "DENY" },
];

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // Server-only packages with native or dynamic requires stay out of the bundle.
  serverExternalPackages: ["pg", "pdfkit", "nodemailer", "@aws-sdk/client-s3", "web-ifc"],
  // forbidden() and app/forbidden.tsx: a project member whose role may not open a page sees "not allowed" (403).
  experimental: { authInterrupts: true },
  async headers() {
    return [{ source: "/:path*", headers: SECURITY_HEADERS }];
  },
};

export default nextConfig;
