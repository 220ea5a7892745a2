/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // Server-only packages with native or dynamic requires stay out of the bundle.
  serverExternalPackages: ["pg", "pdfkit", "nodemailer", "@aws-sdk/client-s3"],
  // forbidden() and app/forbidden.tsx: a project member whose role may not open a page sees "not allowed" (403).
  experimental: { authInterrupts: true },
};

export default nextConfig;
