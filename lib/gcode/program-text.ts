// Program bytes → program text, or a refusal with a message for the person who sent the
// file. One rule for every way a program comes in (the CLI, the upload): an empty or blank
// file has no program in it; a file with a NUL byte, or bytes that are not UTF-8, is not a
// text program (a spreadsheet, an image, a UTF-16 or Latin-1 export) and would otherwise be
// read as one long line of garbage and estimated at 0 s without a word.
//
// ProgramTextCheck takes the bytes chunk by chunk (an upload stream), so a bad file is refused
// at the chunk that shows it; checkProgramBytes is the same check on a whole buffer. Lines are
// counted as interpret() counts them (NISTIR 6556 §3.3: a line ends at CR, LF or CRLF); bytes
// and lines in messages are numbered from 1. Pure: no Node modules (runs in a browser worker).

export type ProgramTextRefusalCode = 'empty' | 'blank' | 'nul-byte' | 'invalid-utf8';

export interface ProgramTextRefusal {
  ok: false;
  code: ProgramTextRefusalCode;
  /** one sentence, no line breaks, for the person who sent the file */
  message: string;
  /** the offending byte, numbered from 1 (nul-byte, invalid-utf8) */
  byte?: number;
  /** the line that byte is on, numbered from 1 */
  line?: number;
}

export interface ProgramText {
  ok: true;
  /** the decoded program (a leading byte-order mark dropped); '' when keepText was false */
  text: string;
  lineCount: number;
  byteLength: number;
}

export type ProgramTextResult = ProgramText | ProgramTextRefusal;

/**
 * Start of the first ill-formed UTF-8 sequence in b[from…] (the WHATWG decoder's rules: no
 * overlong forms, no surrogates, nothing above U+10FFFF), b.length when all of it is well formed
 * up to a sequence the end cuts short, or -1 when it is all well formed and complete.
 */
function firstInvalidUtf8(b: Uint8Array, from: number): number {
  const n = b.length;
  let i = from;
  while (i < n) {
    const c = b[i];
    if (c < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let lo = 0x80;
    let hi = 0xbf;
    if (c >= 0xc2 && c <= 0xdf) need = 1;
    else if (c >= 0xe0 && c <= 0xef) {
      need = 2;
      if (c === 0xe0) lo = 0xa0;
      else if (c === 0xed) hi = 0x9f;
    } else if (c >= 0xf0 && c <= 0xf4) {
      need = 3;
      if (c === 0xf0) lo = 0x90;
      else if (c === 0xf4) hi = 0x8f;
    } else return i;
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return n;
      const d = b[i + k];
      if (d < lo || d > hi) return i;
      lo = 0x80;
      hi = 0xbf;
    }
    i += need + 1;
  }
  return -1;
}

/** the bytes at the end of b that begin a UTF-8 sequence b does not finish (at most 3) */
function unfinishedTail(b: Uint8Array): Uint8Array {
  const n = b.length;
  for (let back = 1; back <= Math.min(3, n); back++) {
    const c = b[n - back];
    if (c < 0x80) return b.subarray(n);
    // C0, C1 and F5–FF begin no sequence: left to the decoder, which refuses them now
    if (c < 0xc2 && c >= 0xc0) return b.subarray(n);
    if (c > 0xf4) return b.subarray(n);
    if (c >= 0xc0) {
      const len = c >= 0xf0 ? 4 : c >= 0xe0 ? 3 : 2;
      return len > back ? b.subarray(n - back) : b.subarray(n);
    }
  }
  return b.subarray(n);
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  if (a.length === 0) return b;
  const out = new Uint8Array(a.length + b.length);
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}

/** line ends in c[0, to) under the §3.3 rules; prevByte is the byte before c[0] (-1 at the start) */
function countLineEnds(c: Uint8Array, to: number, prevByte: number): number {
  let ends = 0;
  for (let i = 0; i < to; i++) {
    const b = c[i];
    if (b > 13) continue;
    if (b === 13) ends++;
    else if (b === 10 && (i > 0 ? c[i - 1] : prevByte) !== 13) ends++;
  }
  return ends;
}

/** true when the text holds anything but white space (it stops at the first such character) */
function hasText(t: string): boolean {
  for (let i = 0; i < t.length; i++) {
    const c = t.charCodeAt(i);
    if (c !== 32 && c !== 9 && c !== 10 && c !== 13 && c !== 11 && c !== 12) return true;
  }
  return false;
}

function refusal(code: ProgramTextRefusalCode, message: string, byte?: number, line?: number): ProgramTextRefusal {
  const r: ProgramTextRefusal = { ok: false, code, message };
  if (byte !== undefined) r.byte = byte;
  if (line !== undefined) r.line = line;
  return r;
}

export class ProgramTextCheck {
  // not the decoder's stream mode (three to four times slower here on large chunks): each chunk
  // is decoded whole, up to a sequence it leaves unfinished, which waits for the next one; the
  // byte-order mark is kept by the decoder and dropped once, at the start of the text
  private readonly decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });
  private readonly keepText: boolean;
  private readonly parts: string[] = [];
  private bytes = 0;
  private lineEnds = 0;
  private lastByte = -1;
  /** a byte other than white space and the leading byte-order mark was seen */
  private sawText = false;
  /** no text decoded yet, so a byte-order mark would still be the file's own */
  private atStart = true;
  /** the bytes of a sequence the last chunk left unfinished */
  private carry: Uint8Array = new Uint8Array(0);
  private refused: ProgramTextRefusal | null = null;
  private finished: ProgramTextResult | null = null;

  /** keepText: collect the decoded text for finish() (default true) */
  constructor(options: { keepText?: boolean } = {}) {
    this.keepText = options.keepText !== false;
  }

  get byteLength(): number {
    return this.bytes;
  }

  /** the refusal, once a chunk has shown one; null while the bytes are fine */
  get refusal(): ProgramTextRefusal | null {
    return this.refused;
  }

  /** takes the next chunk; returns the refusal when this or an earlier chunk shows one */
  push(chunk: Uint8Array): ProgramTextRefusal | null {
    if (this.refused || this.finished) return this.refused;
    if (chunk.length === 0) return null;
    const start = this.bytes;
    const carried = this.carry.length;
    const buf = concat(this.carry, chunk);
    const tail = unfinishedTail(buf);
    let piece = '';
    let bad = -1;
    let badByte = -1;
    try {
      piece = this.decoder.decode(buf.subarray(0, buf.length - tail.length));
    } catch {
      const at = firstInvalidUtf8(buf, 0);
      badByte = buf[at >= 0 && at < buf.length ? at : 0];
      bad = start - carried + (at >= 0 && at < buf.length ? at : 0);
    }
    const nulAt = chunk.indexOf(0);
    if (nulAt >= 0 && (bad < 0 || start + nulAt < bad)) return this.refuse('nul-byte', start + nulAt, chunk, start, 0);
    if (bad >= 0) return this.refuse('invalid-utf8', bad, chunk, start, badByte);
    if (this.atStart && piece.length > 0) {
      this.atStart = false;
      if (piece.charCodeAt(0) === 0xfeff) piece = piece.slice(1);
    }
    if (this.keepText && piece.length > 0) this.parts.push(piece);
    if (!this.sawText) this.sawText = hasText(piece);
    this.lineEnds += countLineEnds(chunk, chunk.length, this.lastByte);
    this.carry = tail.length === 0 ? tail : tail.slice();
    this.bytes += chunk.length;
    this.lastByte = chunk[chunk.length - 1];
    return null;
  }

  /** after the last chunk: the text and its line count, or the refusal */
  finish(): ProgramTextResult {
    if (this.refused) return this.refused;
    if (this.finished) return this.finished;
    // the file ends inside a multi-byte sequence
    if (this.carry.length > 0) return this.refuse('invalid-utf8', this.bytes - this.carry.length, new Uint8Array(0), this.bytes, this.carry[0]);
    if (this.bytes === 0) return (this.refused = refusal('empty', 'The file is empty.'));
    if (!this.sawText) return (this.refused = refusal('blank', 'The file holds only blank lines, so there is no program in it.'));
    const last = this.lastByte;
    const lineCount = this.lineEnds + (last === 10 || last === 13 ? 0 : 1);
    this.finished = { ok: true, text: this.parts.join(''), lineCount, byteLength: this.bytes };
    this.parts.length = 0;
    return this.finished;
  }

  private refuse(code: 'nul-byte' | 'invalid-utf8', at: number, chunk: Uint8Array, chunkStart: number, badByte: number): ProgramTextRefusal {
    // bytes before the chunk were counted; a bad sequence that began in an earlier chunk holds
    // no CR or LF, so counting the chunk up to the bad byte gives its line
    const line = this.lineEnds + countLineEnds(chunk, Math.max(0, at - chunkStart), this.lastByte) + 1;
    const byte = at + 1;
    const where = `byte ${byte.toLocaleString('en')}, on line ${line.toLocaleString('en')}`;
    // FF and FE never occur in UTF-8; at the start they are most likely a UTF-16 byte-order mark
    const message =
      code === 'nul-byte'
        ? `The file is not a text G-code program (${where}, is a NUL byte).`
        : at === 0 && (badByte === 0xff || badByte === 0xfe)
          ? `The file is not a text G-code program in UTF-8 (${where}, is not valid UTF-8; it may be UTF-16 text); save it as UTF-8 or plain ASCII.`
          : `The file is not a text G-code program in UTF-8 (${where}, is not valid UTF-8); save it as UTF-8 or plain ASCII.`;
    this.refused = refusal(code, message, byte, line);
    this.parts.length = 0;
    return this.refused;
  }
}

/** the whole file at once: its text and line count, or the refusal */
export function checkProgramBytes(bytes: Uint8Array): ProgramTextResult {
  const check = new ProgramTextCheck();
  check.push(bytes);
  return check.finish();
}
