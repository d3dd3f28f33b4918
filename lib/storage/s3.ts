// Object storage for uploaded G-code programs and generated quote PDFs. Talks S3 through
// @aws-sdk/client-s3 only, so the local fake (scripts/s3-fake.ts) and a hosted bucket
// are the same code path; S3_* in lib/env.ts choose which. Server-only.
import {
  CreateBucketCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  DeleteObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { env } from '@/lib/env';

export interface StorageConfig {
  endpoint: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
}

export function storageConfigFromEnv(): StorageConfig {
  return {
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
  };
}

export function createS3Client(config: StorageConfig = storageConfigFromEnv()): S3Client {
  return new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Checksums only where S3 demands them: S3-compatible stores (the local fake among
    // them) reject the SDK's default trailing-checksum uploads.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
}

const globalForS3 = globalThis as unknown as { kerfcastS3?: S3Client };

function client(): S3Client {
  return (globalForS3.kerfcastS3 ??= createS3Client());
}

export interface StoredObject {
  body: Buffer;
  contentType: string | undefined;
  sizeBytes: number;
}

export async function putObject(
  key: string,
  body: Buffer | Uint8Array | string,
  contentType = 'application/octet-stream',
  bucket: string = env.S3_BUCKET,
): Promise<void> {
  await client().send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }));
}

/** The object's bytes, or null when the key does not exist. */
export async function getObject(key: string, bucket: string = env.S3_BUCKET): Promise<StoredObject | null> {
  try {
    const out = await client().send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    if (!out.Body) return null;
    const body = Buffer.from(await out.Body.transformToByteArray());
    return { body, contentType: out.ContentType, sizeBytes: body.length };
  } catch (err) {
    if (isNotFound(err)) return null;
    throw err;
  }
}

export async function deleteObject(key: string, bucket: string = env.S3_BUCKET): Promise<void> {
  await client().send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

/** Creates the bucket when it is missing (the local fake creates the demo and test buckets itself). */
export async function ensureBucket(bucket: string = env.S3_BUCKET): Promise<void> {
  try {
    await client().send(new HeadBucketCommand({ Bucket: bucket }));
  } catch (err) {
    if (!isNotFound(err)) throw err;
    await client().send(new CreateBucketCommand({ Bucket: bucket }));
  }
}

function isNotFound(err: unknown): boolean {
  if (err instanceof S3ServiceException) {
    return err.name === 'NoSuchKey' || err.name === 'NotFound' || err.name === 'NoSuchBucket' || err.$metadata?.httpStatusCode === 404;
  }
  return false;
}
