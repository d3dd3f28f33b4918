// The upload's pass-through meter (lib/programs/program-meter.ts): SHA-256, bytes and lines of
// a program as it streams, chunk borders anywhere. References: SHA-256 test vectors of NIST
// FIPS 180-4 (the "abc" and 448-bit messages of the NIST example set, from memory, cross-checked
// with node:crypto over the whole buffer); line ends as NISTIR 6556 §3.3 defines them (CR, LF or
// both end one line; lib/gcode/line-ends.ts countLines and JavaScript's split on /\r\n|\r|\n/
// as the references); refusals word for word as the CLI's check (checkProgramBytes) words them.
import { createHash } from 'node:crypto';
import { Readable, Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { describe, expect, it } from 'vitest';
import { checkProgramBytes } from '@/lib/gcode/program-text';
import { countLines } from '@/lib/gcode/line-ends';
import { ProgramMeter, ProgramRefusedError, ProgramTooLargeError, type ProgramMeasure } from '@/lib/programs/program-meter';

const utf8 = (s: string) => Buffer.from(s, 'utf8');

interface Run {
  measure: ProgramMeasure | null;
  passed: Buffer;
  error: unknown;
}

/** Streams the buffer through a meter in pieces cut at the given offsets. */
async function run(bytes: Buffer, cuts: number[] = [], maxBytes = 1 << 20): Promise<Run> {
  const at = [...new Set(cuts.filter((c) => c > 0 && c < bytes.length))].sort((a, b) => a - b);
  const pieces: Buffer[] = [];
  let from = 0;
  for (const c of [...at, bytes.length]) {
    pieces.push(bytes.subarray(from, c));
    from = c;
  }
  const meter = new ProgramMeter(maxBytes);
  const out: Buffer[] = [];
  const sink = new Writable({
    write(chunk: Buffer, _e, cb) {
      out.push(chunk);
      cb();
    },
  });
  let error: unknown = null;
  try {
    await pipeline(Readable.from(pieces.filter((p) => p.length > 0)), meter, sink);
  } catch (err) {
    error = err;
  }
  return { measure: meter.measure, passed: Buffer.concat(out), error };
}

const everyCut = (n: number) => Array.from({ length: n + 1 }, (_, i) => [i]);

describe('SHA-256 while streaming (FIPS 180-4 example vectors)', () => {
  it.each([
    ['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    ['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
  ])('%s gives the published digest, cut anywhere', async (message, digest) => {
    const bytes = utf8(message);
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(digest);
    for (const cuts of [[], ...everyCut(bytes.length), [1, 2, 3, 17, 40]]) {
      const r = await run(bytes, cuts);
      expect(r.error).toBeNull();
      expect(r.measure?.sha256).toBe(digest);
      expect(r.measure?.bytes).toBe(bytes.length);
      expect(r.measure?.lines).toBe(1);
    }
  });

  it('passes every byte on unchanged (what reaches storage is what was hashed)', async () => {
    const text = 'G21 G90\r\n(Fräsen – Ø6 mm)\nG0 Z5\rG1 Z-18.5 F600\r\nM30\n';
    const bytes = utf8(text);
    for (const [cut] of everyCut(bytes.length)) {
      const r = await run(bytes, [cut, cut + 3]);
      expect(r.passed.equals(bytes)).toBe(true);
      expect(r.measure?.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    }
  });
});

describe('lines across chunk borders (NISTIR 6556 §3.3: CR, LF or CRLF end one line)', () => {
  // hand-counted from the §3.3 rule: each CR, LF or CR LF pair ends a line; a last line
  // without an end counts too
  it.each([
    ['G0 X1\nG0 X2\n', 2],
    ['G0 X1\r\nG0 X2\r\n', 2],
    ['G0 X1\rG0 X2\r', 2],
    ['G0 X1\r\nG0 X2', 2],
    ['G0 X1\r\r\nG0 X2', 3],
    ['G0 X1\n\rG0 X2', 3],
    ['G0 X1\n\nG0 X2\n', 3],
    ['%\r\nG0 X1\rG1 Y2\nM30\r\n%', 5],
  ])('%j has %i lines, wherever the chunks are cut', async (text, lines) => {
    expect(countLines(text)).toBe(lines);
    expect(text.split(/\r\n|\r|\n/).length - (/[\r\n]$/.test(text) ? 1 : 0)).toBe(lines);
    const bytes = utf8(text);
    for (const cuts of [[], ...everyCut(bytes.length)]) {
      const r = await run(bytes, cuts);
      expect(r.measure?.lines, `cut at ${cuts.join(',')}`).toBe(lines);
    }
  });

  it('a CR at the end of one chunk and the LF at the start of the next are one line end', async () => {
    const bytes = utf8('G0 X1\r\nG0 X2\r\nG0 X3');
    const cr = bytes.indexOf(13);
    const r = await run(bytes, [cr + 1]);
    expect(bytes[cr + 1]).toBe(10);
    expect(r.measure?.lines).toBe(3);
  });

  it('counts one-byte chunks of a mixed program like the whole-buffer check', async () => {
    const text = Array.from({ length: 60 }, (_, i) => `G1 X${i} Y${i * 2}${['\n', '\r\n', '\r'][i % 3]}`).join('') + 'M30';
    const bytes = utf8(text);
    const r = await run(bytes, Array.from({ length: bytes.length }, (_, i) => i));
    const whole = checkProgramBytes(bytes);
    expect(whole.ok && whole.lineCount).toBe(61);
    expect(r.measure?.lines).toBe(61);
  });

  it('a multi-byte character cut between chunks is still UTF-8', async () => {
    const bytes = utf8('(Ø 6 mm)\nG0 X1\n');
    for (const [cut] of everyCut(4)) {
      const r = await run(bytes, [cut]);
      expect(r.error).toBeNull();
      expect(r.measure?.lines).toBe(2);
    }
  });
});

describe('refusals: the CLI\'s messages, and the byte limit', () => {
  it.each([
    ['empty', Buffer.alloc(0)],
    ['blank', utf8('\r\n  \n\t\n')],
    ['NUL byte', Buffer.concat([utf8('G0 X1\nG0 '), Buffer.from([0]), utf8('X2\n')])],
    ['UTF-16 text', Buffer.from('\ufeffG0 X1\n', 'utf16le')],
    ['Latin-1 text', Buffer.from('(Fr\xe4sen)\nG0 X1\n', 'latin1')],
  ])('%s: refused with the message checkProgramBytes gives', async (_label, bytes) => {
    const expected = checkProgramBytes(bytes);
    expect(expected.ok).toBe(false);
    for (const cuts of [[], [1], [3], [7]]) {
      const r = await run(bytes, cuts);
      expect(r.error).toBeInstanceOf(ProgramRefusedError);
      expect((r.error as ProgramRefusedError).message).toBe(!expected.ok && expected.message);
      expect(r.measure).toBeNull();
    }
  });

  it('names the byte and line of a NUL byte in the second chunk', async () => {
    const bytes = Buffer.concat([utf8('G0 X1\r\nG0 X2\nG0 '), Buffer.from([0])]);
    const r = await run(bytes, [5]);
    expect((r.error as Error).message).toContain('byte 17, on line 3');
  });

  it('takes a file of exactly the limit and refuses one byte more', async () => {
    const ok = utf8('G0 X1\nG0 X2\n');
    expect((await run(ok, [4], ok.length)).measure?.bytes).toBe(ok.length);
    const over = await run(Buffer.concat([ok, utf8('\n')]), [4], ok.length);
    expect(over.error).toBeInstanceOf(ProgramTooLargeError);
    expect((over.error as ProgramTooLargeError).limitBytes).toBe(ok.length);
    expect(over.measure).toBeNull();
  });
});
