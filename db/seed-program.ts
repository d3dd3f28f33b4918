// A demo program stored as version 1 the way the seed modules need it: the bytes in the bucket
// under a key of the shop, job and program (v1-<first 16 hex of the sha256><extension>), the
// version row with its sha256, size and line count. storeSeedProgram adds the program row and
// the job's program-uploaded event, as an upload records them.
import { createHash } from 'node:crypto';
import path from 'node:path';
import { putObject } from '@/lib/storage/s3';
import type { Tx } from './queries/machines';
import { jobEvents, programs, programVersions } from './schema';

export type SeedProgramInput = { shopId: number; jobId: number; name: string; bytes: Buffer; uploadedBy: number | null };

export async function storeSeedVersion(tx: Tx, input: SeedProgramInput & { programId: number }): Promise<{ versionId: number; sha256: string }> {
  const { shopId, jobId, programId, name, bytes, uploadedBy } = input;
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const objectKey = `shops/${shopId}/jobs/${jobId}/programs/${programId}/v1-${sha256.slice(0, 16)}${path.extname(name)}`;
  await putObject(objectKey, bytes, 'text/plain; charset=utf-8');
  const lines = bytes.toString('utf8').split('\n').length;
  const [{ id: versionId }] = await tx
    .insert(programVersions)
    .values({ shopId, programId, version: 1, objectKey, sha256, bytes: bytes.length, lines, uploadedBy })
    .$returningId();
  return { versionId, sha256 };
}

export async function storeSeedProgram(tx: Tx, input: SeedProgramInput): Promise<{ programId: number; versionId: number; sha256: string }> {
  const { shopId, jobId, name, uploadedBy } = input;
  const [{ id: programId }] = await tx.insert(programs).values({ shopId, jobId, name, latestVersion: 1 }).$returningId();
  const { versionId, sha256 } = await storeSeedVersion(tx, { ...input, programId });
  await tx.insert(jobEvents).values({ shopId, jobId, userId: uploadedBy, kind: 'program-uploaded', detail: `${name}, version 1` });
  return { programId, versionId, sha256 };
}
