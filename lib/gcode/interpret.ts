// The interpreter's main loop: walks the text line by line (LF or CRLF), tokenizes each line
// (fast scanner, gcode-parser's parseLine for anything unusual), interprets it, reports
// progress every `progressEvery` lines and stops early when the signal is aborted.
import { computeFacts } from './facts';
import { executeLine as executeLineImp } from './execute-line';
import { Interp } from './interpreter-state';
import type { InterpretOptions, InterpretResult } from './move-list';
import { scanLine as scanLineImp, tokenizeWithParser } from './tokenize-line';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const executeLine = executeLineImp;
const scanLine = scanLineImp;


function countLines(text: string): number {
  if (text.length === 0) return 0;
  let n = 0;
  let i = -1;
  while ((i = text.indexOf('\n', i + 1)) !== -1) n++;
  return text.charCodeAt(text.length - 1) === 10 ? n : n + 1;
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
  while (pos < len) {
    let end = text.indexOf('\n', pos);
    if (end === -1) end = len;
    lineNo++;
    ip.lineNo = lineNo;
    w.reset();
    let issues = scanLine(text, pos, end, w);
    if (issues !== 0 || w.wordCount !== 0 || parserOnly) {
      ip.lineStart = pos;
      ip.lineEnd = end;
      if (issues !== 0 || parserOnly) {
        w.reset();
        issues |= tokenizeWithParser(ip.lineText, w);
      }
      executeLine(ip, issues);
    }
    pos = end + 1;
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
