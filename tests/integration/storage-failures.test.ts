// lib/storage when the store is not what we expect (issue 19 point 6): a missing object
// reads as null (a program whose stored copy is gone), a deleted object is gone, and a
// store that does not answer is an error, never read as "missing": an outage must not
// look like a lost program. The S3 fake of scripts/services-start.sh for the first two;
// a loopback port with nothing listening for the last (the S3 client of the module is
// swapped for one aimed there, and put back after).
import net from 'node:net';
import { randomBytes } from 'node:crypto';
import type { S3Client } from '@aws-sdk/client-s3';
import { afterEach, describe, expect, it } from 'vitest';
import { env } from '@/lib/env';
import { createS3Client, deleteObject, getObject, putObject, storageConfigFromEnv } from '@/lib/storage/s3';

const holder = globalThis as unknown as { kerfcastS3?: S3Client };
const prefix = `tests/failures-${randomBytes(4).toString('hex')}`;

async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

describe('missing objects (S3 fake)', () => {
  it('a key that was never written reads as null', async () => {
    expect(await getObject(`${prefix}/never-written.nc`)).toBeNull();
  });

  it('an object deleted after writing reads as null, and deleting it again is not an error', async () => {
    const key = `${prefix}/bracket.nc`;
    await putObject(key, 'G21\nG0 Z5\nM30\n', 'text/x-gcode');
    expect((await getObject(key))?.sizeBytes).toBe(14); // 'G21\nG0 Z5\nM30\n' is 14 bytes
    await deleteObject(key);
    expect(await getObject(key)).toBeNull();
    // S3 DeleteObject succeeds on a missing key (S3 API reference, DeleteObject)
    await expect(deleteObject(key)).resolves.toBeUndefined();
  });
});

describe('a bucket that does not exist', () => {
  // Known gap, left for the storage owner (lib/storage/s3.ts): getObject maps NoSuchBucket to
  // null along with NoSuchKey, so a misnamed S3_BUCKET reads every stored program as missing
  // instead of failing as the misconfiguration it is. it.fails until getObject tells the two
  // apart (ensureBucket still needs NoSuchBucket as "missing" for HeadBucket).
  it.fails('getObject from a missing bucket is an error, not a missing object', async () => {
    await expect(getObject(`${prefix}/any.nc`, `kerfcast-missing-${randomBytes(3).toString('hex')}`)).rejects.toThrow();
  });
});

describe('a store that does not answer', () => {
  const saved = holder.kerfcastS3;
  afterEach(() => {
    holder.kerfcastS3?.destroy();
    holder.kerfcastS3 = saved;
  });

  async function aimAtNothing(): Promise<void> {
    const client = createS3Client({ ...storageConfigFromEnv(), endpoint: `http://127.0.0.1:${await closedPort()}` });
    holder.kerfcastS3 = client;
  }

  it('getObject rejects instead of reading the object as missing', async () => {
    await aimAtNothing();
    await expect(getObject(`${prefix}/anything.nc`)).rejects.toThrow();
  });

  it('putObject rejects, so an upload is never recorded as stored', async () => {
    await aimAtNothing();
    await expect(putObject(`${prefix}/upload.nc`, 'G21\nM30\n', 'text/x-gcode', env.S3_BUCKET)).rejects.toThrow();
  });
});
