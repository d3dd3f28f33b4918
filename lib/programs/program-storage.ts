import 'server-only';
// Program files in object storage: a streamed upload (multipart where large, through
// @aws-sdk/lib-storage), a streamed read for downloads, and deletion. Uses the S3 settings of
// lib/storage/s3.ts with a client of its own, cached like that module's.
import { DeleteObjectCommand, GetObjectCommand, S3ServiceException, type S3Client } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Readable } from 'node:stream';
import { env } from '@/lib/env';
import { createS3Client } from '@/lib/storage/s3';

const globalForPrograms = globalThis as unknown as { kerfcastProgramS3?: S3Client };

function client(): S3Client {
  return (globalForPrograms.kerfcastProgramS3 ??= createS3Client());
}

/** S3's smallest part (5 MiB); a file up to this size goes up in one PutObject */
const PART_BYTES = 5 * 1024 * 1024;
/** parts in flight at once: the upload holds at most about QUEUE × PART_BYTES of a file in memory */
const QUEUE = 2;

export const PROGRAM_CONTENT_TYPE = 'text/plain; charset=utf-8';

/**
 * Sends the stream to `key` and resolves once the object is complete. When the stream errors
 * (a refused file, an aborted request) the upload reads no further, waits for the parts in
 * flight, abandons the multipart upload and rejects; it is not aborted from outside, because an
 * outside abort answers at once while a part or a single PutObject may still land afterwards,
 * after the caller's clean-up. The caller deletes `key` after a rejection all the same.
 */
export async function uploadProgramObject(key: string, body: Readable): Promise<void> {
  const upload = new Upload({
    client: client(),
    params: { Bucket: env.S3_BUCKET, Key: key, Body: body, ContentType: PROGRAM_CONTENT_TYPE },
    partSize: PART_BYTES,
    queueSize: QUEUE,
    leavePartsOnError: false,
  });
  await upload.done();
}

/** Deletes the object; a key that is not there is fine (S3 answers 204 either way). */
export async function deleteProgramObject(key: string): Promise<void> {
  await client().send(new DeleteObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
}

/** Deletes every key, trying each even when one fails; rejects with the first failure. */
export async function deleteProgramObjects(keys: readonly string[]): Promise<void> {
  const results = await Promise.allSettled(keys.map((key) => deleteProgramObject(key)));
  const failed = results.find((r): r is PromiseRejectedResult => r.status === 'rejected');
  if (failed) throw failed.reason;
}

export interface ProgramObjectStream {
  body: ReadableStream<Uint8Array>;
  bytes: number | undefined;
}

/** The object's bytes as a web stream (never read whole into memory), or null when missing. */
export async function openProgramObject(key: string): Promise<ProgramObjectStream | null> {
  try {
    const out = await client().send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
    if (!out.Body) return null;
    return { body: out.Body.transformToWebStream() as ReadableStream<Uint8Array>, bytes: out.ContentLength };
  } catch (err) {
    if (err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.$metadata?.httpStatusCode === 404)) return null;
    throw err;
  }
}
