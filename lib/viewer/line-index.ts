// Where each source line starts in the file's bytes, for the source panel: it decodes only the
// lines on screen. Line ends as the interpreter counts them (NISTIR 6556 §3.3, lib/gcode
// line-ends.ts): LF, CRLF and a lone CR each end one line; a last line without an end counts.
// A leading UTF-8 byte-order mark is skipped.

/** byte offset of the start of each line, and one more entry: the end of the last line's bytes */
export function lineStarts(bytes: Uint8Array): Uint32Array {
  const n = bytes.length;
  let count = 0;
  for (let i = 0; i < n; i++) {
    const c = bytes[i];
    if (c === 10 || (c === 13 && bytes[i + 1] !== 10)) count++;
  }
  const last = n > 0 && bytes[n - 1] !== 10 && bytes[n - 1] !== 13 ? 1 : 0;
  const starts = new Uint32Array(count + last + 1);
  const bom = n >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  starts[0] = bom;
  let k = 1;
  for (let i = 0; i < n; i++) {
    const c = bytes[i];
    if (c === 10 || (c === 13 && bytes[i + 1] !== 10)) starts[k++] = i + 1;
  }
  if (last) starts[k] = n;
  return starts;
}

/** the text of line `line` (1-based) without its line end */
export function lineText(bytes: Uint8Array, starts: Uint32Array, line: number, decoder: TextDecoder): string {
  if (line < 1 || line >= starts.length) return '';
  let end = starts[line];
  const from = starts[line - 1];
  while (end > from && (bytes[end - 1] === 10 || bytes[end - 1] === 13)) end--;
  return decoder.decode(bytes.subarray(from, end));
}

/** lines in the index */
export function lineCountOf(starts: Uint32Array): number {
  return Math.max(0, starts.length - 1);
}
