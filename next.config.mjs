/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // Server-only packages with native or dynamic requires stay out of the bundle.
  serverExternalPackages: ["pg", "pdfkit", "nodemailer", "@aws-sdk/client-s3"],
};

export default nextConfig;
