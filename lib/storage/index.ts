import "server-only";
// Object storage through the S3 API (s3rver locally, any S3-compatible store in production).
// Object keys are always chosen by the server; nothing here takes a path from a user.
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  type S3ClientConfig,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { env } from "@/lib/config/env";

const cache = globalThis as unknown as { caddisS3?: S3Client; caddisS3Public?: S3Client };

function config(endpoint: string): S3ClientConfig {
  return {
    endpoint,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // Newer SDKs add CRC32 checksums to every upload; a browser PUT to a presigned URL cannot
    // send them, and not every S3-compatible store knows them.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  };
}

/** The client the server uses to reach the store. */
export function s3(): S3Client {
  return (cache.caddisS3 ??= new S3Client(config(env.S3_ENDPOINT)));
}

/** The client that signs URLs handed to browsers (S3_PUBLIC_ENDPOINT when it differs). */
function publicS3(): S3Client {
  if (!env.S3_PUBLIC_ENDPOINT) return s3();
  return (cache.caddisS3Public ??= new S3Client(config(env.S3_PUBLIC_ENDPOINT)));
}

export function bucket(): string {
  return env.S3_BUCKET;
}

export async function putObject({ key, body, contentType }: { key: string; body: Uint8Array; contentType: string }) {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType, ContentLength: body.byteLength }));
}

function isMissing(error: unknown) {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === "NoSuchKey" || e?.name === "NotFound" || e?.$metadata?.httpStatusCode === 404;
}

/** Size and stored type of an object, or null when it is not there. */
export async function headObject({ key }: { key: string }): Promise<{ size: number; contentType?: string } | null> {
  try {
    const r = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { size: r.ContentLength ?? 0, contentType: r.ContentType };
  } catch (error) {
    if (isMissing(error)) return null;
    throw error;
  }
}

/** The first `maxBytes` bytes of an object (a ranged GET), or null when it is not there. */
export async function getObjectHead({ key, maxBytes }: { key: string; maxBytes: number }): Promise<Uint8Array | null> {
  try {
    const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key, Range: `bytes=0-${maxBytes - 1}` }));
    if (!r.Body) return new Uint8Array();
    const bytes = await r.Body.transformToByteArray();
    // A store that ignores Range sends the whole object: keep only what was asked for.
    return bytes.subarray(0, maxBytes);
  } catch (error) {
    if (isMissing(error)) return null;
    throw error;
  }
}

/** The object as a web stream to pass straight into a Response, or null. */
export async function getObjectStream({ key }: { key: string }): Promise<{ body: ReadableStream; size?: number } | null> {
  try {
    const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    if (!r.Body) return { body: new Blob([]).stream(), size: 0 };
    return { body: r.Body.transformToWebStream(), size: r.ContentLength };
  } catch (error) {
    if (isMissing(error)) return null;
    throw error;
  }
}

export async function deleteObject({ key }: { key: string }) {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** The keys stored under a prefix (every page of the listing). */
export async function listObjectKeys({ prefix }: { prefix: string }): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }));
    for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

/** Deletes every object under a prefix, and these keys too; returns how many were deleted. */
export async function deleteObjectsUnder({ prefixes, keys = [] }: { prefixes: string[]; keys?: string[] }): Promise<number> {
  const all = new Set(keys);
  for (const prefix of prefixes) {
    // A prefix must end in "/": "patients/1" would also match "patients/10…".
    if (!prefix.endsWith("/")) throw new Error(`object prefix without a trailing slash: ${prefix}`);
    for (const key of await listObjectKeys({ prefix })) all.add(key);
  }
  for (const key of all) await deleteObject({ key });
  return all.size;
}

/**
 * A presigned PUT for one object. Content-Type and Content-Length are signed, so the browser
 * must send exactly the declared type and size; the server checks the bytes afterwards anyway.
 */
export async function presignPut({
  key,
  contentType,
  contentLength,
  expiresInSeconds = 600,
}: {
  key: string;
  contentType: string;
  contentLength: number;
  expiresInSeconds?: number;
}): Promise<{ url: string; headers: Record<string, string>; expiresAt: Date }> {
  const command = new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType, ContentLength: contentLength });
  const url = await getSignedUrl(publicS3(), command, {
    expiresIn: expiresInSeconds,
    signableHeaders: new Set(["content-type", "content-length"]),
  });
  return {
    url,
    headers: { "Content-Type": contentType },
    expiresAt: new Date(Date.now() + expiresInSeconds * 1000),
  };
}
