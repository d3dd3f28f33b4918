// The bytes of one uploaded program on their way to object storage: a pass-through stream
// that hashes them (SHA-256), counts bytes and lines, and runs the program-text check of the
// CLI (lib/gcode/program-text.ts: empty, blank, NUL byte, not UTF-8) chunk by chunk, so a
// file is measured and judged while it streams and never sits in memory whole. A refusal or
// a size over the limit errors the stream at the chunk that shows it; whoever reads the
// stream (the S3 upload) then fails too, and nothing of the file is kept.
import { createHash, type Hash } from 'node:crypto';
import { Transform, type TransformCallback } from 'node:stream';
import { ProgramTextCheck, type ProgramTextRefusal } from '@/lib/gcode/program-text';

export interface ProgramMeasure {
  sha256: string;
  bytes: number;
  /** lines as NISTIR 6556 §3.3 counts them: CR, LF and CRLF each end one */
  lines: number;
}

/** The file is not a program the estimator can read (the CLI refuses it with the same message). */
export class ProgramRefusedError extends Error {
  constructor(readonly refusal: ProgramTextRefusal) {
    super(refusal.message);
    this.name = 'ProgramRefusedError';
  }
}

/** The file passed the byte limit; `limitBytes` is the largest size taken. */
export class ProgramTooLargeError extends Error {
  constructor(readonly limitBytes: number) {
    super(`The file is larger than ${limitBytes.toLocaleString('en')} bytes, the largest program this server takes.`);
    this.name = 'ProgramTooLargeError';
  }
}

export class ProgramMeter extends Transform {
  private readonly hash: Hash = createHash('sha256');
  private readonly check = new ProgramTextCheck({ keepText: false });
  private count = 0;
  private measured: ProgramMeasure | null = null;

  constructor(private readonly maxBytes: number) {
    super();
  }

  /** the figures, once the last byte went through and the file passed */
  get measure(): ProgramMeasure | null {
    return this.measured;
  }

  get bytesSeen(): number {
    return this.count;
  }

  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    this.count += chunk.length;
    if (this.count > this.maxBytes) return callback(new ProgramTooLargeError(this.maxBytes));
    const refusal = this.check.push(chunk);
    if (refusal) return callback(new ProgramRefusedError(refusal));
    this.hash.update(chunk);
    callback(null, chunk);
  }

  override _flush(callback: TransformCallback): void {
    const result = this.check.finish();
    if (!result.ok) return callback(new ProgramRefusedError(result));
    this.measured = { sha256: this.hash.digest('hex'), bytes: result.byteLength, lines: result.lineCount };
    callback();
  }
}
