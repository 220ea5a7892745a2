import "server-only";
// Object storage through @aws-sdk/client-s3: the local s3rver fake under `npm start` and the tests, any
// S3-compatible store in a hosted deployment (S3_ENDPOINT, S3_BUCKET, S3_REGION and the key pair).
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  NoSuchKey,
  NotFound,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";

/** How long a presigned upload or download link stays valid, in seconds. */
export const PRESIGN_SECONDS = 300;

let client: S3Client | undefined;

function env(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set (scripts/stack/services.mjs sets it for the local object store).`);
  return value;
}

/** The bucket every object of Strutroom lives in. */
export function bucket(): string {
  return env("S3_BUCKET");
}

/** The one S3 client of this process. */
export function s3(): S3Client {
  client ??= new S3Client({
    endpoint: env("S3_ENDPOINT"),
    region: process.env.S3_REGION ?? "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: env("S3_ACCESS_KEY_ID"), secretAccessKey: env("S3_SECRET_ACCESS_KEY") },
    // Checksums only where S3 requires them: presigned browser PUTs cannot add the SDK's default CRC32 header,
    // and S3-compatible stores do not all return them.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  return client;
}

/** Stores bytes under key. */
export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType }));
}

/** The whole object, or null when there is none. */
export async function getObject(key: string): Promise<Uint8Array | null> {
  try {
    const result = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return result.Body ? await result.Body.transformToByteArray() : new Uint8Array();
  } catch (error) {
    if (error instanceof NoSuchKey || error instanceof NotFound) return null;
    throw error;
  }
}

/** The stored size of an object in bytes, or null when there is none. */
export async function objectSize(key: string): Promise<number | null> {
  try {
    const result = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return result.ContentLength ?? 0;
  } catch (error) {
    if (error instanceof NotFound || error instanceof NoSuchKey || (error as { name?: string }).name === "NotFound") return null;
    throw error;
  }
}

/** Removes an object; removing one that is not there is not an error (S3 semantics). */
export async function deleteObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** A URL the browser can PUT the file's bytes to, valid for PRESIGN_SECONDS. */
export function presignUpload(key: string, contentType: string): Promise<string> {
  return getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType }), { expiresIn: PRESIGN_SECONDS });
}

/** A URL that downloads the object under the given file name, valid for PRESIGN_SECONDS. */
export function presignDownload(key: string, filename: string, contentType: string, inline = false): Promise<string> {
  const disposition = `${inline ? "inline" : "attachment"}; filename*=UTF-8''${encodeURIComponent(filename)}`;
  return getSignedUrl(
    s3(),
    new GetObjectCommand({ Bucket: bucket(), Key: key, ResponseContentDisposition: disposition, ResponseContentType: contentType }),
    { expiresIn: PRESIGN_SECONDS },
  );
}
