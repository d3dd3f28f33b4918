// An open-addressing hash table from pairs of integer keys (each in 0 … 2^31 − 2, such as a
// snapped point's two grid coordinates) to ids, on typed arrays: the cut graph looks up
// millions of snapped points, and a Map costs more per entry in time and garbage. The pair is
// passed as two small integers, not one combined double: a double argument to a call that is
// not inlined is boxed on every lookup.
//
// Most lookups are of a point not seen yet, at a slot not in the cache, so the table is kept
// small: a slot is the pair's 32-bit hash (with its low bit set; 0 marks an empty slot, so a
// new table needs no filling) and the entry's index, 8 bytes in one array; the keys and the id
// sit in entry arrays filled in insertion order, read only when the hashes match.
import { grownI32 } from './typed-arrays';

export class KeyTable {
  /** slot i at 2i: hash | 1 (0 = empty), entry index */
  private slots: Int32Array;
  private entryA: Int32Array;
  private entryB: Int32Array;
  private entryVal: Int32Array;
  private mask: number;
  /** 32 − log2(slots): the slot is the top bits of the hash */
  private shift: number;
  private size = 0;

  constructor(capacity = 1 << 12) {
    let n = 16, bits = 4;
    while (n < capacity * 2) { n <<= 1; bits++; }
    this.slots = new Int32Array(2 * n);
    this.entryA = new Int32Array(n >> 1);
    this.entryB = new Int32Array(n >> 1);
    this.entryVal = new Int32Array(n >> 1);
    this.mask = n - 1;
    this.shift = 32 - bits;
  }

  /**
   * multiplicative hashing (Knuth, TAOCP vol. 3, §6.4): the top bits of the product mix all
   * the bits of both keys, so neighbouring grid points spread over the table
   */
  private static hash(a: number, b: number): number {
    return Math.imul(Math.imul(a, 0x9e3779b1) ^ b, 0x85ebca6b) | 1;
  }

  /** the id stored for (a, b), or −1 */
  get(a: number, b: number): number {
    const t = this.slots, mask = this.mask;
    const h = KeyTable.hash(a, b);
    for (let i = h >>> this.shift; ; i = (i + 1) & mask) {
      const k = t[2 * i];
      if (k === 0) return -1;
      if (k === h) {
        const e = t[2 * i + 1];
        if (this.entryA[e] === a && this.entryB[e] === b) return this.entryVal[e];
      }
    }
  }

  /** the id stored for (a, b), or −1 after storing val under it (one probe sequence for both) */
  getOrSet(a: number, b: number, val: number): number {
    if ((this.size + 1) * 2 > this.mask + 1) this.grow();
    const t = this.slots, mask = this.mask;
    const h = KeyTable.hash(a, b);
    for (let i = h >>> this.shift; ; i = (i + 1) & mask) {
      const k = t[2 * i];
      if (k === 0) {
        const e = this.size++;
        t[2 * i] = h;
        t[2 * i + 1] = e;
        this.entryA[e] = a;
        this.entryB[e] = b;
        this.entryVal[e] = val;
        return -1;
      }
      if (k === h) {
        const e = t[2 * i + 1];
        if (this.entryA[e] === a && this.entryB[e] === b) return this.entryVal[e];
      }
    }
  }

  private grow(): void {
    const n = 2 * (this.mask + 1);
    const t = new Int32Array(2 * n);
    this.mask = n - 1;
    this.shift--;
    // re-slot every entry: the old slots hold the hashes
    const old = this.slots;
    for (let j = 0; j < old.length; j += 2) {
      const h = old[j];
      if (h === 0) continue;
      for (let i = h >>> this.shift; ; i = (i + 1) & this.mask) {
        if (t[2 * i] === 0) { t[2 * i] = h; t[2 * i + 1] = old[j + 1]; break; }
      }
    }
    this.slots = t;
    this.entryA = grownI32(this.entryA, n >> 1);
    this.entryB = grownI32(this.entryB, n >> 1);
    this.entryVal = grownI32(this.entryVal, n >> 1);
  }
}
