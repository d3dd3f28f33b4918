// Types for the parts of the `gcode-parser` package (plain JavaScript, no bundled types) that
// the tokenizer uses. parseLine returns words as [LETTER, value] pairs; a value that is not a
// number stays the raw string (for example "1..2").
declare module 'gcode-parser' {
  export interface ParsedLine {
    line: string;
    words: Array<[string, number | string]>;
    ln?: number;
    cs?: number;
    err?: boolean;
    cmds?: string[];
    comments?: string[];
  }
  export function parseLine(line: string, options?: { flatten?: boolean; lineMode?: 'original' | 'stripped' | 'compact' }): ParsedLine;
}
