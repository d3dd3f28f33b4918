// Line ends and % demarcation lines of program text. NISTIR 6556 §3.3: a line ends with "a
// carriage return or line feed or both", so LF, CRLF and a lone CR each end one line (and a CR
// followed by LF is one end, not two). §3.1: a file may open and close with a line holding
// nothing but "%", possibly surrounded by white space.

/** white space on a line that is blank for §3.1; U+FEFF is a byte-order mark left at the start */
function isBlankChar(c: number): boolean {
  return c === 32 || c === 9 || c === 13 || c === 10 || c === 11 || c === 12 || c === 0xfeff;
}

/** lines of the text under the §3.3 rules: one per line end, plus a last line without one */
export function countLines(text: string): number {
  const len = text.length;
  if (len === 0) return 0;
  let n = 0;
  let i = -1;
  while ((i = text.indexOf('\n', i + 1)) !== -1) n++;
  // a CR ends a line of its own unless an LF follows it (then the LF was counted)
  i = -1;
  while ((i = text.indexOf('\r', i + 1)) !== -1) if (text.charCodeAt(i + 1) !== 10) n++;
  const last = text.charCodeAt(len - 1);
  return last === 10 || last === 13 ? n : n + 1;
}

/** true when text[start, end) holds only white space */
export function isBlank(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (!isBlankChar(text.charCodeAt(i))) return false;
  return true;
}

/** true when text[start, end) is a §3.1 percent line: "%" with only white space around it */
export function isPercentLine(text: string, start: number, end: number): boolean {
  let i = start;
  while (i < end && isBlankChar(text.charCodeAt(i))) i++;
  if (i >= end || text.charCodeAt(i) !== 37) return false;
  return isBlank(text, i + 1, end);
}

/**
 * The first line after `from` (the start of line `lineNo`) with anything but white space on
 * it: its number, start and end, or null when the rest of the text is blank.
 */
export function firstNonBlankLine(text: string, from: number, lineNo: number): { line: number; start: number; end: number } | null {
  const len = text.length;
  let line = lineNo;
  let start = from;
  for (let i = from; i < len; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || c === 13) {
      if (c === 13 && text.charCodeAt(i + 1) === 10) i++;
      line++;
      start = i + 1;
    } else if (!isBlankChar(c)) {
      let end = start;
      while (end < len && text.charCodeAt(end) !== 10 && text.charCodeAt(end) !== 13) end++;
      return { line, start, end };
    }
  }
  return null;
}
