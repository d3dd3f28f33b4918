// An open-addressing hash table from integer keys (below 2^53) to ids, on typed arrays: the
// cut graph looks up millions of snapped points and edges, and a Map costs more per entry in
// time and garbage.

export class KeyTable {
  private keys: Float64Array;
  private vals: Int32Array;
  private mask: number;
  private size = 0;

  constructor(capacity = 1 << 12) {
    let n = 1;
    while (n < capacity * 2) n <<= 1;
    this.keys = new Float64Array(n).fill(-1);
    this.vals = new Int32Array(n);
    this.mask = n - 1;
  }

  private slot(key: number): number {
    // keys are whole and non-negative: a power-of-two split is exact and cheaper than a float modulo
    const hi = Math.floor(key * 2.3283064365386963e-10);
    const lo = key - hi * 4294967296;
    return (Math.imul(lo | 0, 0x9e3779b1) ^ Math.imul(hi | 0, 0x85ebca6b)) & this.mask;
  }

  /** the id stored for key, or −1 */
  get(key: number): number {
    const keys = this.keys;
    for (let i = this.slot(key); ; i = (i + 1) & this.mask) {
      const k = keys[i];
      if (k === key) return this.vals[i];
      if (k === -1) return -1;
    }
  }

  set(key: number, val: number): void {
    if ((this.size + 1) * 2 > this.keys.length) this.grow();
    const keys = this.keys;
    for (let i = this.slot(key); ; i = (i + 1) & this.mask) {
      const k = keys[i];
      if (k === key) { this.vals[i] = val; return; }
      if (k === -1) { keys[i] = key; this.vals[i] = val; this.size++; return; }
    }
  }

  /** the id stored for key, or −1 after storing val under it (one probe sequence for both) */
  getOrSet(key: number, val: number): number {
    if ((this.size + 1) * 2 > this.keys.length) this.grow();
    const keys = this.keys;
    for (let i = this.slot(key); ; i = (i + 1) & this.mask) {
      const k = keys[i];
      if (k === key) return this.vals[i];
      if (k === -1) { keys[i] = key; this.vals[i] = val; this.size++; return -1; }
    }
  }

  clear(): void {
    this.keys = new Float64Array(16).fill(-1);
    this.vals = new Int32Array(16);
    this.mask = 15;
    this.size = 0;
  }

  private grow(): void {
    const oldK = this.keys, oldV = this.vals;
    this.keys = new Float64Array(oldK.length * 2).fill(-1);
    this.vals = new Int32Array(oldK.length * 2);
    this.mask = this.keys.length - 1;
    this.size = 0;
    for (let i = 0; i < oldK.length; i++) if (oldK[i] !== -1) this.set(oldK[i], oldV[i]);
  }
}
