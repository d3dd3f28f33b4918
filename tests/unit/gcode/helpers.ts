// Test helpers: run a program and sum what the tests compare (lengths by kind, points).
import { interpret, moveLength, MoveKind, type InterpretOptions, type InterpretResult } from '@/lib/gcode';

export function run(text: string, options?: InterpretOptions): InterpretResult {
  return interpret(text, options);
}

export function totals(r: InterpretResult): { rapid: number; feed: number; arc: number; moves: number; dwellS: number } {
  const m = r.moves;
  let rapid = 0;
  let feed = 0;
  let arc = 0;
  let dwellS = 0;
  for (let i = 0; i < m.count; i++) {
    const k = m.kind[i];
    if (k === MoveKind.rapid) rapid += moveLength(m, i);
    else if (k === MoveKind.feed) feed += moveLength(m, i);
    else if (k === MoveKind.arc) arc += moveLength(m, i);
    else if (k === MoveKind.dwell) dwellS += m.aux[i];
  }
  return { rapid, feed, arc, moves: m.count, dwellS };
}

export function points(r: InterpretResult, kinds?: number[]): Array<[string, number, number, number]> {
  const m = r.moves;
  const out: Array<[string, number, number, number]> = [];
  const names = ['rapid', 'feed', 'arc', 'dwell', 'toolChange', 'spindleStart', 'spindleStop', 'programStop', 'programEnd'];
  for (let i = 0; i < m.count; i++) {
    if (kinds && !kinds.includes(m.kind[i])) continue;
    out.push([names[m.kind[i]], round(m.x[i]), round(m.y[i]), round(m.z[i])]);
  }
  return out;
}

export function round(v: number, d = 6): number {
  const f = 10 ** d;
  const r = Math.round(v * f) / f;
  return r === 0 ? 0 : r;
}

export function codes(r: InterpretResult): string[] {
  return r.diagnostics.map((d) => d.code);
}

export function errors(r: InterpretResult): string[] {
  return r.diagnostics.filter((d) => d.severity === 'error').map((d) => d.code);
}
