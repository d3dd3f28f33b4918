// lib/storage against the S3 fake that scripts/services-start.sh runs: what goes in
// comes back byte for byte through @aws-sdk/client-s3, missing keys read as null, and
// ensureBucket creates a bucket that was not there.
import { createHash, randomBytes } from 'node:crypto';
import { DeleteBucketCommand, ListBucketsCommand } from '@aws-sdk/client-s3';
import { afterAll, describe, expect, it } from 'vitest';
import { createS3Client, deleteObject, ensureBucket, getObject, putObject } from '@/lib/storage/s3';
import { env } from '@/lib/env';

const prefix = `tests/${randomBytes(4).toString('hex')}`;
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

describe('object storage (S3 fake)', () => {
  const written: string[] = [];
  afterAll(async () => {
    for (const key of written) await deleteObject(key);
  });

  it('round-trips a G-code program as text with its content type', async () => {
    const key = `${prefix}/bracket.nc`;
    const program = 'G21 G90\nG0 Z5\nG1 Z-18.5 F600\nM30\n';
    await putObject(key, program, 'text/x-gcode');
    written.push(key);
    const back = await getObject(key);
    expect(back?.body.toString('utf8')).toBe(program);
    expect(back?.contentType).toBe('text/x-gcode');
    expect(back?.sizeBytes).toBe(Buffer.byteLength(program));
  });

  it('round-trips every byte value unchanged (binary PDF-like payload)', async () => {
    const key = `${prefix}/quote.bin`;
    const bytes = Buffer.concat([Buffer.from(Array.from({ length: 256 }, (_, i) => i)), randomBytes(200_000)]);
    await putObject(key, bytes, 'application/pdf');
    written.push(key);
    const back = await getObject(key);
    expect(back && sha256(back.body)).toBe(sha256(bytes));
  });

  it('reads a missing key as null', async () => {
    expect(await getObject(`${prefix}/does-not-exist.nc`)).toBeNull();
  });

  it('ensureBucket leaves the existing bucket alone and creates a missing one', async () => {
    await ensureBucket(env.S3_BUCKET);
    const extra = `kerfcast-test-${randomBytes(3).toString('hex')}`;
    await ensureBucket(extra);
    const buckets = await createS3Client().send(new ListBucketsCommand({}));
    const names = (buckets.Buckets ?? []).map((b) => b.Name);
    expect(names).toContain(env.S3_BUCKET);
    expect(names).toContain(extra);
    await putObject('probe.txt', 'ok', 'text/plain', extra);
    expect((await getObject('probe.txt', extra))?.body.toString()).toBe('ok');
    await deleteObject('probe.txt', extra);
    await createS3Client().send(new DeleteBucketCommand({ Bucket: extra }));
  });
});
