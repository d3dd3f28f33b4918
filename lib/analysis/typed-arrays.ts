// Growing the typed arrays the analysis keeps its tables in: a copy into one of the new length.

export function grownF64(a: Float64Array, n: number): Float64Array<ArrayBuffer> {
  const b = new Float64Array(n);
  b.set(a);
  return b;
}

export function grownI32(a: Int32Array, n: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(n);
  b.set(a);
  return b;
}
