// Shared pieces of the benchmarks: the baseline every ratio is taken against (bare gcode-parser
// parseLine over every line of the program) and the median of repeated rounds.
import { parseLine } from 'gcode-parser';

/** (a) of every engine benchmark: gcode-parser's parseLine on each line, nothing else */
export function bareParse(text: string): number {
  let words = 0;
  let pos = 0;
  const len = text.length;
  while (pos < len) {
    let end = text.indexOf('\n', pos);
    if (end === -1) end = len;
    words += parseLine(text.slice(pos, end)).words.length;
    pos = end + 1;
  }
  return words;
}

export function median(a: number[]): number {
  const s = [...a].sort((x, y) => x - y);
  return s[Math.floor(s.length / 2)];
}
