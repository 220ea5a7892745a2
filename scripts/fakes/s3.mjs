// Local stand-in for a hosted S3-compatible object store (design.md, "object storage"): s3rver on loopback, its
// data folder under STRUTROOM_DATA_DIR, the product's bucket created at start with a CORS rule that lets the web
// app's pages PUT and GET through presigned URLs. The app reaches it only through @aws-sdk/client-s3.
import path from "node:path";
import { mkdirSync } from "node:fs";
import S3rver from "s3rver";

const port = Number(process.env.S3_PORT);
const dataDir = process.env.STRUTROOM_DATA_DIR;
const bucket = process.env.S3_BUCKET;
const appUrl = process.env.APP_URL;
if (!port || !dataDir || !bucket || !appUrl) {
  console.error("The S3 fake needs S3_PORT, STRUTROOM_DATA_DIR, S3_BUCKET and APP_URL (set by scripts/stack/services.mjs).");
  process.exit(1);
}

const directory = path.join(dataDir, "s3");
mkdirSync(directory, { recursive: true });

const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>${new URL(appUrl).origin}</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>600</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

const server = new S3rver({
  address: "127.0.0.1",
  port,
  directory,
  silent: true,
  // Path-style only: the SDK is configured with forcePathStyle, and loopback has no bucket subdomains.
  vhostBuckets: false,
  configureBuckets: [{ name: bucket, configs: [cors] }],
});

await server.run();
console.log(`S3 fake on http://127.0.0.1:${port}, bucket "${bucket}", data in ${directory}`);

const stop = () => server.close().finally(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
