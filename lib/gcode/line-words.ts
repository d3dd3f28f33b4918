// The words of one line, as the interpreter reads them: G and M codes in order, one value per
// other letter, and what went wrong while collecting them. Reused for every line, so the hot
// path allocates nothing. Letters are indexed 0…25 (A…Z).

export const L = {
  A: 0, B: 1, C: 2, D: 3, E: 4, F: 5, G: 6, H: 7, I: 8, J: 9, K: 10, L: 11, M: 12,
  N: 13, O: 14, P: 15, Q: 16, R: 17, S: 18, T: 19, U: 20, V: 21, W: 22, X: 23, Y: 24, Z: 25,
} as const;

const MAX_CODES = 16;

export interface WordSink {
  reset(): void;
  add(letter: number, value: number): void;
  bad(letter: number, raw: string): void;
}

export class LineWords implements WordSink {
  private stamp = 1;
  private readonly seen = new Int32Array(26);
  readonly value = new Float64Array(26);
  readonly g = new Float64Array(MAX_CODES);
  gCount = 0;
  readonly m = new Float64Array(MAX_CODES);
  mCount = 0;
  /** bit per letter repeated on the line */
  duplicates = 0;
  /** letters whose value was not a number, with the raw text */
  badWords: Array<{ letter: number; raw: string }> = [];
  tooManyCodes = false;
  /** words on the line, bad ones included */
  wordCount = 0;
  /** bit per letter other than G and M present on the line */
  letterMask = 0;

  reset(): void {
    this.stamp++;
    this.wordCount = 0;
    this.letterMask = 0;
    this.gCount = 0;
    this.mCount = 0;
    this.duplicates = 0;
    this.tooManyCodes = false;
    if (this.badWords.length) this.badWords = [];
  }

  has(letter: number): boolean {
    return this.seen[letter] === this.stamp;
  }

  add(letter: number, value: number): void {
    this.wordCount++;
    if (letter === 6) {
      if (this.gCount < MAX_CODES) this.g[this.gCount++] = value;
      else this.tooManyCodes = true;
    } else if (letter === 12) {
      if (this.mCount < MAX_CODES) this.m[this.mCount++] = value;
      else this.tooManyCodes = true;
    } else if (this.seen[letter] === this.stamp) {
      this.duplicates |= 1 << letter;
    } else {
      this.seen[letter] = this.stamp;
      this.value[letter] = value;
      this.letterMask |= 1 << letter;
    }
  }

  bad(letter: number, raw: string): void {
    this.wordCount++;
    this.badWords.push({ letter, raw });
  }
}

/** collects words as a list, for tests and tools that want the tokens themselves */
export class WordList implements WordSink {
  words: Array<[string, number | string]> = [];
  reset(): void {
    this.words = [];
  }
  add(letter: number, value: number): void {
    this.words.push([String.fromCharCode(65 + letter), value]);
  }
  bad(letter: number, raw: string): void {
    this.words.push([String.fromCharCode(65 + letter), raw]);
  }
}
