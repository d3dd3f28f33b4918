// The interpreter's main loop: walks the text line by line, tokenizes each line (fast scanner,
// gcode-parser's parseLine for anything unusual), interprets it, reports progress every
// `progressEvery` lines and stops early when the signal is aborted.
// Line ends follow NISTIR 6556 §3.3: LF, CRLF or a lone CR. A file demarcated by % lines
// (§3.1) ends at its second % line: what follows is not interpreted, and a file that opens
// with % but never closes it is reported as an error (it may have been cut short).
import { computeFacts } from './facts';
import { executeLine as executeLineImp } from './execute-line';
import { Interp } from './interpreter-state';
import { countLines, firstNonBlankLine, isBlank, isPercentLine as isPercentLineImp } from './line-ends';
import type { InterpretOptions, InterpretResult } from './move-list';
import { ScanIssue, scanLine as scanLineImp, tokenizeWithParser } from './tokenize-line';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const executeLine = executeLineImp;
const scanLine = scanLineImp;
const isPercentLine = isPercentLineImp;
// a pure % line scans as a delimiter, or as a controller command after a non-ASCII mark (a BOM)
const PERCENT_BITS: number = ScanIssue.delimiter | ScanIssue.controller;

/** §3.1 demarcation: 0 before any % line, OPENED after a leading one, OTHER after a later one */
const OPENED = 1;
const OTHER = 2;

/** a % line at [pos, end): the new demarcation state, or CLOSED when it closes the file */
const CLOSED = 3;
function percentLine(state: number, text: string, pos: number): number {
  if (state === 0) return isBlank(text, 0, pos) ? OPENED : OTHER;
  return state === OPENED ? CLOSED : state;
}

/** what the % lines of the file call for once the loop is done */
function reportDemarcation(ip: Interp, state: number, openLine: number, openText: string, closeLine: number, text: string, after: number): void {
  if (state === OPENED) {
    ip.diag.add('percent-unclosed', openLine, 'the program opens with a % line but no % line closes it, so the file may have been cut short (NISTIR 6556 §3.1)', openText);
  } else if (state === CLOSED) {
    const rest = firstNonBlankLine(text, after, closeLine + 1);
    if (rest) ip.diag.add('lines-after-closing-percent', rest.line, `everything after the closing % on line ${closeLine} is ignored (NISTIR 6556 §3.1)`, text.slice(rest.start, rest.end));
  }
}

export function interpret(text: string, options: InterpretOptions = {}): InterpretResult {
  const total = countLines(text);
  // most lines make about one move: small programs get one small chunk, large ones 65,536-move chunks
  const ip = new Interp(options, Math.min(Math.max(total + 16, 256), 1 << 16));
  ip.src = text;
  const every = Math.max(1, Math.floor(options.progressEvery ?? 50_000));
  const onProgress = options.onProgress;
  const signal = options.signal;
  const w = ip.w;
  const parserOnly = options.tokenizer === 'parser';
  let cancelled = false;
  let pos = 0;
  let lineNo = 0;
  let nextCheck = every;
  const len = text.length;
  // the next LF and the next CR at or after pos (len when none), each searched again only once
  // passed: an LF-only file searches for CR once, a CR-only file for LF once
  let nextLf = -1;
  let nextCr = -1;
  let demarcation = 0;
  let openLine = 0;
  let openText = '';
  let closeLine = 0;
  let limit = len;
  while (pos < limit) {
    if (nextLf < pos) {
      nextLf = text.indexOf('\n', pos);
      if (nextLf === -1) nextLf = len;
    }
    if (nextCr < pos) {
      nextCr = text.indexOf('\r', pos);
      if (nextCr === -1) nextCr = len;
    }
    let end = nextLf;
    let next = nextLf + 1;
    if (nextCr < nextLf) {
      end = nextCr;
      next = nextCr + 1 === nextLf ? nextLf + 1 : nextCr + 1;
    }
    lineNo++;
    ip.lineNo = lineNo;
    w.reset();
    let issues = scanLine(text, pos, end, w);
    if (issues !== 0 || w.wordCount !== 0 || parserOnly) {
      if ((issues & PERCENT_BITS) !== 0 && isPercentLine(text, pos, end)) {
        demarcation = percentLine(demarcation, text, pos);
        if (demarcation === OPENED && openLine === 0) {
          openLine = lineNo;
          openText = text.slice(pos, end);
        }
        if (demarcation === CLOSED) {
          // the file ends here; the progress check below still runs for this line
          closeLine = lineNo;
          limit = 0;
        }
      } else {
        ip.lineStart = pos;
        ip.lineEnd = end;
        if (issues !== 0 || parserOnly) {
          w.reset();
          issues |= tokenizeWithParser(ip.lineText, w);
        }
        executeLine(ip, issues);
      }
    }
    pos = next;
    if (lineNo === nextCheck) {
      nextCheck += every;
      if (signal?.aborted) {
        cancelled = true;
        break;
      }
      onProgress?.(lineNo, total);
    }
  }
  if (!cancelled) {
    reportDemarcation(ip, demarcation, openLine, openText, closeLine, text, pos);
    if (!ip.ended && ip.moves.count > 0) ip.diag.add('program-end-missing', 0, 'the program has no M2/M30 end');
    onProgress?.(total, total);
  }
  const moves = ip.moves.finish();
  const f = computeFacts(moves);
  return {
    moves,
    diagnostics: ip.diag.finish(),
    cancelled,
    facts: {
      units: ip.declaredUnits ?? (options.defaultUnits === 'inch' ? 'inch' : 'mm'),
      lineCount: total,
      ...f,
    },
  };
}
