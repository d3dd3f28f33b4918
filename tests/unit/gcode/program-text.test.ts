// Program bytes → text or a refusal (lib/gcode/program-text.ts), whole and chunk by chunk.
// References: UTF-8 well-formedness is the Unicode Standard's (§3.9, Table 3-7: no overlong
// forms, no surrogates D800–DFFF, nothing above U+10FFFF), and the platform's TextDecoder
// (WHATWG Encoding Standard) is the independent oracle for which byte sequences are valid and
// where the first bad one starts; line ends are NISTIR 6556 §3.3's (CR, LF or both), with the
// interpreter's own line count and JavaScript's split on /\r\n|\r|\n/ as the references.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkProgramBytes, interpret, ProgramTextCheck, type ProgramTextResult } from '@/lib/gcode';

const utf8 = (s: string) => new TextEncoder().encode(s);
const bytes = (...b: number[]) => new Uint8Array(b);

/** where the first ill-formed sequence starts (0-based), by the platform decoder; -1 when valid */
function oracleInvalidAt(b: Uint8Array): number {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(b);
    return -1;
  } catch {
    // the replacing decoder puts U+FFFD where the first bad sequence starts; count the bytes before it
    const s = new TextDecoder('utf-8', { ignoreBOM: true }).decode(b);
    let off = 0;
    for (const ch of s) {
      if (ch === '\ufffd' && !(b[off] === 0xef && b[off + 1] === 0xbf && b[off + 2] === 0xbd)) return off;
      off += utf8(ch).length;
    }
    throw new Error('no replacement character found');
  }
}

function inChunks(b: Uint8Array, cuts: number[], keepText = true): ProgramTextResult {
  const check = new ProgramTextCheck({ keepText });
  const at = [...new Set(cuts.map((c) => c % (b.length + 1)))].sort((x, y) => x - y);
  let from = 0;
  for (const c of [...at, b.length]) {
    check.push(b.subarray(from, c));
    from = c;
  }
  return check.finish();
}

describe('checkProgramBytes: files that are no program', () => {
  it('an empty file', () => {
    expect(checkProgramBytes(new Uint8Array(0))).toEqual({ ok: false, code: 'empty', message: 'The file is empty.' });
  });

  it('a file of blank lines, or a byte-order mark alone', () => {
    for (const b of [utf8('  \n\t\r\n\r'), bytes(0xef, 0xbb, 0xbf), bytes(0xef, 0xbb, 0xbf, 10, 32)]) {
      const r = checkProgramBytes(b);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.code).toBe('blank');
    }
  });

  it('a NUL byte: refused with its byte and line, numbered from 1 (line ends per §3.3)', () => {
    const before = 'G21\r\n(plate)\rG1 X1';
    const r = checkProgramBytes(utf8(before + '\0 F600\n'));
    expect(r).toMatchObject({ ok: false, code: 'nul-byte', byte: before.length + 1, line: 3 });
    if (!r.ok) expect(r.message).toBe(`The file is not a text G-code program (byte ${before.length + 1}, on line 3, is a NUL byte).`);
  });

  it.each([
    ['a Latin-1 é (0xE9) in a comment', [0x28, 0xe9, 0x29], 1],
    ['an overlong "/" (C0 AF)', [0xc0, 0xaf], 0],
    ['a UTF-16 surrogate (ED A0 80)', [0xed, 0xa0, 0x80], 0],
    ['a code point above U+10FFFF (F4 90 80 80)', [0xf4, 0x90, 0x80, 0x80], 0],
    ['a lone continuation byte (80)', [0x80], 0],
    ['a sequence cut short by the end of the file (E2 82)', [0xe2, 0x82], 0],
    ['a sequence cut short by ASCII (E2 82 41)', [0xe2, 0x82, 0x41], 0],
  ])('%s: not valid UTF-8, at the byte where the bad sequence starts', (_name, bad, offsetInBad) => {
    const head = utf8('G21\nG1 X1 F600\n');
    const b = new Uint8Array([...head, ...bad, 10]);
    const at = head.length + offsetInBad;
    expect(oracleInvalidAt(b)).toBe(at); // the platform decoder agrees on the place
    const r = checkProgramBytes(b);
    expect(r).toMatchObject({ ok: false, code: 'invalid-utf8', byte: at + 1, line: 3 });
    if (!r.ok) expect(r.message).toMatch(new RegExp(`byte ${at + 1}, on line 3, is not valid UTF-8`));
  });

  it('UTF-16 text (FF FE byte-order mark) is refused with a hint to save it as UTF-8', () => {
    const le = bytes(0xff, 0xfe, ...[...'G21\n'].flatMap((c) => [c.charCodeAt(0), 0]));
    const r = checkProgramBytes(le);
    expect(r).toMatchObject({ ok: false, code: 'invalid-utf8', byte: 1, line: 1 });
    if (!r.ok) expect(r.message).toMatch(/UTF-16 text.*save it as UTF-8/);
  });

  it('messages are one line', () => {
    for (const b of [new Uint8Array(0), utf8('\n\n'), utf8('G1\0'), bytes(0x47, 0xff)]) {
      const r = checkProgramBytes(b);
      expect(r.ok).toBe(false); // empty, blank, NUL, invalid UTF-8: each is refused
      if (!r.ok) expect(r.message).not.toMatch(/[\r\n]/);
    }
  });
});

describe('checkProgramBytes: text programs', () => {
  it('UTF-8 text with 2-, 3- and 4-byte characters passes unchanged; a leading byte-order mark is dropped', () => {
    const text = '(Ø20 mm hole, 90° corner, ✓ checked, 🪵 birch)\nG21 G90\nM30\n';
    expect(checkProgramBytes(utf8(text))).toEqual({ ok: true, text, lineCount: 3, byteLength: utf8(text).length });
    const withBom = new Uint8Array([0xef, 0xbb, 0xbf, ...utf8(text)]);
    const r = checkProgramBytes(withBom);
    expect(r.ok && r.text).toBe(text);
  });

  it('the line count is the interpreter’s for LF, CRLF, CR and a last line without an end', () => {
    const line = fc.stringMatching(/^[GXYZ0-9 .()%-]{0,12}$/);
    const eol = fc.constantFrom('\n', '\r', '\r\n', '');
    let counted = 0;
    fc.assert(
      fc.property(fc.array(fc.tuple(line, eol), { minLength: 1, maxLength: 20 }), (parts) => {
        const text = parts.map(([l, e]) => l + e).join('');
        const r = checkProgramBytes(utf8(text));
        if (!r.ok) {
          expect(r.code).toBe(text.trim() === '' ? (text === '' ? 'empty' : 'blank') : 'not refused');
          return;
        }
        expect(r.lineCount).toBe(interpret(text).facts.lineCount);
        const split = text.split(/\r\n|\r|\n/);
        expect(r.lineCount).toBe(/[\r\n]$/.test(text) ? split.length - 1 : split.length);
        counted++;
      }),
      { numRuns: 300 },
    );
    // only an all-blank text is refused (a few percent of these): most runs compared counts
    expect(counted).toBeGreaterThanOrEqual(200);
  });
});

// bytes that exercise every path: ASCII, white space, CR/LF, NUL, and pieces of multi-byte sequences
const anyByte = fc.oneof(
  { weight: 6, arbitrary: fc.integer({ min: 0x20, max: 0x7e }) },
  { weight: 2, arbitrary: fc.constantFrom(10, 13, 32, 9) },
  { weight: 1, arbitrary: fc.constant(0) },
  { weight: 3, arbitrary: fc.constantFrom(0xc3, 0xa9, 0xe2, 0x82, 0xac, 0xf0, 0x9f, 0xaa, 0xb5, 0xed, 0xa0, 0xc0, 0xf5, 0xff, 0xef, 0xbb, 0xbf, 0x80) },
);

describe('ProgramTextCheck: chunk by chunk', () => {
  it('any bytes cut into any chunks give the whole-buffer result', () => {
    fc.assert(
      fc.property(fc.array(anyByte, { maxLength: 60 }), fc.array(fc.nat(), { maxLength: 8 }), (arr, cuts) => {
        const b = new Uint8Array(arr);
        const whole = checkProgramBytes(b);
        expect(inChunks(b, cuts)).toEqual(whole);
        // keepText: false gives the same verdict and counts, without the text
        const bare = inChunks(b, cuts, false);
        if (whole.ok) expect(bare).toEqual({ ...whole, text: '' });
        else expect(bare).toEqual(whole);
      }),
      { numRuns: 1000 },
    );
  });

  it('the whole-buffer verdict agrees with the platform decoder: the first NUL or bad sequence, whichever comes first', () => {
    fc.assert(
      fc.property(fc.array(anyByte, { maxLength: 60 }), (arr) => {
        const b = new Uint8Array(arr);
        const r = checkProgramBytes(b);
        const bad = oracleInvalidAt(b);
        const nul = b.indexOf(0);
        if (nul >= 0 && (bad < 0 || nul < bad)) expect(r).toMatchObject({ ok: false, code: 'nul-byte', byte: nul + 1 });
        else if (bad >= 0) expect(r).toMatchObject({ ok: false, code: 'invalid-utf8', byte: bad + 1 });
        else if (r.ok) expect(r.text).toBe(new TextDecoder().decode(b));
        else expect(['empty', 'blank']).toContain(r.code);
        if (!r.ok && r.byte !== undefined) {
          // the line of the bad byte, counted by the §3.3 rules on the text before it
          const before = new TextDecoder('utf-8', { ignoreBOM: true }).decode(b.subarray(0, r.byte - 1));
          expect(r.line).toBe(before.split(/\r\n|\r|\n/).length);
        }
      }),
      { numRuns: 1000 },
    );
  });

  it('a multi-byte character split across chunks at every point decodes whole', () => {
    const text = 'G1 X1 (🪵 ✓ é)\r\nM30';
    const b = utf8(text);
    for (let k = 0; k <= b.length; k++) {
      expect(inChunks(b, [k])).toEqual({ ok: true, text, lineCount: 2, byteLength: b.length });
    }
    // one byte at a time
    expect(inChunks(b, b.map((_, i) => i) as unknown as number[])).toEqual({ ok: true, text, lineCount: 2, byteLength: b.length });
  });

  it('refuses at the chunk that shows the NUL and keeps that answer; a CR at a chunk end and an LF at the next start are one line end', () => {
    const check = new ProgramTextCheck();
    expect(check.push(utf8('G21\r'))).toBeNull();
    expect(check.push(utf8('\nG1 X1 F600\n'))).toBeNull();
    const refused = check.push(utf8('G1 X2\0\n'));
    expect(refused).toMatchObject({ ok: false, code: 'nul-byte', byte: 4 + 12 + 6, line: 3 });
    expect(check.refusal).toEqual(refused);
    expect(check.push(utf8('G1 X3\n'))).toEqual(refused);
    expect(check.finish()).toEqual(refused);
  });

  it('a file that ends inside a multi-byte sequence is refused at finish, at the sequence’s first byte', () => {
    const check = new ProgramTextCheck();
    expect(check.push(utf8('G21\n('))).toBeNull();
    expect(check.push(bytes(0xf0, 0x9f))).toBeNull();
    expect(check.finish()).toMatchObject({ ok: false, code: 'invalid-utf8', byte: 6, line: 2 });
  });
});
