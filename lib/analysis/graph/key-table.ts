// A hash table from pairs of integer keys (each in 0 … 2^31 − 2, such as a snapped point's two
// grid coordinates) to ids, on typed arrays: the cut graph looks up millions of snapped points,
// and a Map costs more per entry in time and garbage. The pair is passed as two small
// integers, not one combined double: a double argument to a call that is not inlined is boxed
// on every lookup.
//
// Most lookups are of a point not seen yet, and in a table of a whole program's points (many
// megabytes) a slot chosen by a plain hash is a cache miss every time, which was most of the
// cut graph's cost. The points come along the tool path, each near the one before, so the table
// is paged: the pair's coarse cell (its keys without their low `cellBits` bits) picks a page of
// 64 slots (512 bytes), and the pair's own hash the first slot within it, probing linearly round
// the page. The points of one stretch of a profile share a page that is already in cache. A
// cell of 2^13 keys is 82 mm on the cut graph's 0.01 mm grid: on the generated 1,000,000-line
// nest its 606,828 lookups change page 98,647 times and 18,408 keys overflow (2^12: 140,402 and
// 9,211; 2^14: 55,609 and 75,366). With 2^12 cells the probes' share of the analysis's CPU
// profile was a third below that of one plain table. A page that fills to PAGE_LIMIT (a dense engraving, say) sends its further keys to an overflow table
// hashed the plain way; pages never empty, so a key is looked for there only when its page is
// full. A slot is the pair's 32-bit hash with its low bit set (0 marks an empty slot, so a new
// table needs no filling) and the entry's index; keys and ids sit in entry arrays filled in
// insertion order, read only when the hashes match.
import { grownI32 } from '../typed-arrays';

const PAGE = 64;
const PAGE_LIMIT = 48;

export class KeyTable {
  /** page p's slot j at 2(64p + j): hash | 1 (0 = empty), entry index */
  private readonly pages: Int32Array;
  private readonly pageFill: Uint8Array;
  /** 32 − log2(pages): the page is the top bits of the cell's hash */
  private readonly pageShift: number;
  private overflow = new Int32Array(2 * 1024);
  private overflowMask = 1023;
  private overflowShift = 22;
  private overflowSize = 0;
  private entryA: Int32Array;
  private entryB: Int32Array;
  private entryVal: Int32Array;
  private size = 0;

  /** capacity: about how many keys to expect; keys that differ only in their low cellBits bits share a page */
  constructor(capacity = 1 << 12, private readonly cellBits = 13) {
    // pages for twice the expected keys (a page is half full on average when all are in)
    let np = 1, bits = 0;
    while (np * PAGE < capacity * 2) { np <<= 1; bits++; }
    this.pages = new Int32Array(2 * PAGE * np);
    this.pageFill = new Uint8Array(np);
    this.pageShift = 32 - bits;
    const n = Math.max(16, capacity);
    this.entryA = new Int32Array(n);
    this.entryB = new Int32Array(n);
    this.entryVal = new Int32Array(n);
  }

  /**
   * multiplicative hashing (Knuth, TAOCP vol. 3, §6.4): the top bits of the product mix all
   * the bits of both keys, so neighbouring grid points (or cells) spread over the table
   */
  private static hash(a: number, b: number): number {
    return Math.imul(Math.imul(a, 0x9e3779b1) ^ b, 0x85ebca6b) | 1;
  }

  private pageOf(a: number, b: number): number {
    // a table of one page has pageShift 32, which >>> reads as 0
    return this.pageShift >= 32 ? 0 : KeyTable.hash(a >>> this.cellBits, b >>> this.cellBits) >>> this.pageShift;
  }

  /**
   * the entry of (a, b) with hash h in the page at slot `base`, or −1 − i for the slot i at which
   * the probe stopped (the empty slot to take, unless the page is full)
   */
  private probePage(base: number, h: number, a: number, b: number): number {
    const t = this.pages;
    let i = (h >>> 1) & (PAGE - 1);
    for (let j = 0; j < PAGE; j++, i = (i + 1) & (PAGE - 1)) {
      const k = t[2 * (base + i)];
      if (k === 0) break;
      if (k === h) {
        const e = t[2 * (base + i) + 1];
        if (this.entryA[e] === a && this.entryB[e] === b) return e;
      }
    }
    return -1 - i;
  }

  /** the id stored for (a, b), or −1 */
  get(a: number, b: number): number {
    const h = KeyTable.hash(a, b);
    const p = this.pageOf(a, b);
    let e = this.probePage(p * PAGE, h, a, b);
    if (e < 0 && this.pageFill[p] >= PAGE_LIMIT) e = this.findOverflow(h, a, b);
    return e < 0 ? -1 : this.entryVal[e];
  }

  /** the id stored for (a, b), or −1 after storing val under it (one probe sequence for both) */
  getOrSet(a: number, b: number, val: number): number {
    const h = KeyTable.hash(a, b);
    const p = this.pageOf(a, b);
    const base = p * PAGE;
    const found = this.probePage(base, h, a, b);
    if (found >= 0) return this.entryVal[found];
    if (this.pageFill[p] < PAGE_LIMIT) {
      const slot = 2 * (base - 1 - found);
      const e = this.add(a, b, val);
      this.pages[slot] = h;
      this.pages[slot + 1] = e;
      this.pageFill[p]++;
      return -1;
    }
    const over = this.findOverflow(h, a, b);
    if (over >= 0) return this.entryVal[over];
    this.addOverflow(h, this.add(a, b, val));
    return -1;
  }

  private add(a: number, b: number, val: number): number {
    const e = this.size++;
    if (e === this.entryA.length) {
      const n = 2 * e;
      this.entryA = grownI32(this.entryA, n);
      this.entryB = grownI32(this.entryB, n);
      this.entryVal = grownI32(this.entryVal, n);
    }
    this.entryA[e] = a;
    this.entryB[e] = b;
    this.entryVal[e] = val;
    return e;
  }

  private findOverflow(h: number, a: number, b: number): number {
    const t = this.overflow, mask = this.overflowMask;
    for (let i = h >>> this.overflowShift; ; i = (i + 1) & mask) {
      const k = t[2 * i];
      if (k === 0) return -1;
      if (k === h) {
        const e = t[2 * i + 1];
        if (this.entryA[e] === a && this.entryB[e] === b) return e;
      }
    }
  }

  private addOverflow(h: number, e: number): void {
    if ((this.overflowSize + 1) * 2 > this.overflowMask + 1) this.growOverflow();
    this.overflowSize++;
    KeyTable.place(this.overflow, this.overflowMask, this.overflowShift, h, e);
  }

  private static place(t: Int32Array, mask: number, shift: number, h: number, e: number): void {
    let i = h >>> shift;
    while (t[2 * i] !== 0) i = (i + 1) & mask;
    t[2 * i] = h;
    t[2 * i + 1] = e;
  }

  private growOverflow(): void {
    const old = this.overflow;
    const n = old.length; // slots × 2 before, slots after
    this.overflow = new Int32Array(2 * n);
    this.overflowMask = n - 1;
    this.overflowShift--;
    // the old slots hold the hashes
    for (let j = 0; j < old.length; j += 2) if (old[j] !== 0) KeyTable.place(this.overflow, this.overflowMask, this.overflowShift, old[j], old[j + 1]);
  }
}
