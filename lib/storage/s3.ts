import "server-only";
// Object storage for attachments (S3-compatible: the fake s3rver of `npm start`, or the firm's S3).
// Both checksum settings are needed: without them a streamed upload can be stored with extra bytes
// and no error.
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { requireSetting, serverEnv } from "@/lib/server-env";

type StorageConfig = { client: S3Client; bucket: string };

let cached: { key: string; config: StorageConfig } | null = null;

/** Made when first used. */
export function getStorage(): StorageConfig {
  const endpoint = requireSetting("S3_ENDPOINT");
  const bucket = requireSetting("S3_BUCKET");
  const key = `${endpoint}|${bucket}`;
  if (cached?.key !== key) {
    const client = new S3Client({
      endpoint,
      region: serverEnv().S3_REGION,
      forcePathStyle: true,
      credentials: { accessKeyId: requireSetting("S3_ACCESS_KEY_ID"), secretAccessKey: requireSetting("S3_SECRET_ACCESS_KEY") },
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
    });
    cached = { key, config: { client, bucket } };
  }
  return cached.config;
}

export async function putObject({
  key,
  body,
  contentType = "application/octet-stream",
}: {
  key: string;
  body: Uint8Array | string;
  contentType?: string;
}): Promise<{ key: string; etag: string | null }> {
  const { client, bucket } = getStorage();
  const result = await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }));
  return { key, etag: result.ETag ?? null };
}

/** The whole object in memory (attachments are small); null when there is no such key. */
export async function getObject({ key }: { key: string }): Promise<{ body: Uint8Array; contentType: string | null } | null> {
  const { client, bucket } = getStorage();
  try {
    const result = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    if (!result.Body) return null;
    return { body: await result.Body.transformToByteArray(), contentType: result.ContentType ?? null };
  } catch (error) {
    if ((error as { name?: string }).name === "NoSuchKey") return null;
    throw error;
  }
}

/** Whether an object is stored under the key (a HEAD: no bytes are read). */
export async function objectExists({ key }: { key: string }): Promise<boolean> {
  const { client, bucket } = getStorage();
  try {
    await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return true;
  } catch (error) {
    const failure = error as { name?: string; $metadata?: { httpStatusCode?: number } };
    if (failure.name === "NotFound" || failure.name === "NoSuchKey" || failure.$metadata?.httpStatusCode === 404) return false;
    throw error;
  }
}

export async function deleteObject({ key }: { key: string }): Promise<void> {
  const { client, bucket } = getStorage();
  await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

/** A time-limited URL a browser can GET (download) or PUT (upload) without our credentials. */
export async function presignUrl({
  key,
  method,
  expiresInSeconds = 300,
  contentType,
}: {
  key: string;
  method: "GET" | "PUT";
  expiresInSeconds?: number;
  contentType?: string;
}): Promise<string> {
  const { client, bucket } = getStorage();
  const command =
    method === "GET"
      ? new GetObjectCommand({ Bucket: bucket, Key: key })
      : new PutObjectCommand({ Bucket: bucket, Key: key, ContentType: contentType });
  return getSignedUrl(client, command, { expiresIn: expiresInSeconds });
}
