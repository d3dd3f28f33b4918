// Collects diagnostics with a cap per code, so a program full of one mistake still returns
// within its time budget: the first CAP of each code are listed, the rest are counted and
// summarised at the end. A diagnostic's message is a full sentence without its line number,
// which the diagnostic's `line` carries and every listing shows beside it.
import { DIAGNOSTIC_CODES, type DiagnosticCode } from './diagnostic-codes';
import type { Diagnostic } from './move-list';

const CAP = 200;

export class DiagnosticSink {
  readonly list: Diagnostic[] = [];
  private readonly counts = new Map<DiagnosticCode, number>();

  /** message without the line number, as a clause or sentence; text is the source line (always given for errors) */
  add(code: DiagnosticCode, line: number, message: string, text?: string, column?: number): void {
    const n = (this.counts.get(code) ?? 0) + 1;
    this.counts.set(code, n);
    if (n > CAP) return;
    const severity = DIAGNOSTIC_CODES[code].severity;
    const d: Diagnostic = { line, severity, code, message: sentence(message) };
    if (column !== undefined) d.column = column;
    if (text !== undefined) d.text = text.replace(/\r$/, '');
    this.list.push(d);
  }

  /** only the first occurrence of this code in the program */
  once(code: DiagnosticCode, line: number, message: string, text?: string): void {
    if (!this.counts.has(code)) this.add(code, line, message, text);
  }

  count(code: DiagnosticCode): number {
    return this.counts.get(code) ?? 0;
  }

  finish(): Diagnostic[] {
    for (const [code, n] of this.counts) {
      if (n > CAP) this.list.push({ line: 0, severity: 'info', code: 'diagnostics-truncated', message: sentence(`${n - CAP} more "${code}" findings were counted but not listed (${n} in all)`) });
    }
    return this.list;
  }
}

/** a capital to start and a full stop to end: the texts above are written as clauses */
function sentence(text: string): string {
  const t = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(t) ? t : `${t}.`;
}
