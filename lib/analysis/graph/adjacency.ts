// The edges at each vertex of the cut graph, in compressed rows: vertex v's edges sit at
// adj[start[v] … start[v + 1]), in edge order. Built in two passes over the edge list (count,
// then place), with no array per vertex. Used by the overlap zipping (cut-graph.ts) and by the
// pruning and the loop walk (faces.ts).

/** how many edge ends meet at each vertex */
export function vertexDegrees(eu: Int32Array, ev: Int32Array, vertexCount: number, edgeCount: number): Int32Array {
  const deg = new Int32Array(vertexCount);
  for (let e = 0; e < edgeCount; e++) {
    deg[eu[e]]++;
    deg[ev[e]]++;
  }
  return deg;
}

export interface VertexEdges {
  /** vertexCount + 1 offsets into adj */
  start: Int32Array;
  /** edge ids, two entries per edge (one at each end) */
  adj: Int32Array;
}

/** the rows of edges at each vertex, from the degrees vertexDegrees() gave */
export function vertexEdges(eu: Int32Array, ev: Int32Array, deg: Int32Array, vertexCount: number, edgeCount: number): VertexEdges {
  const start = new Int32Array(vertexCount + 1);
  for (let v = 0; v < vertexCount; v++) start[v + 1] = start[v] + deg[v];
  const fill = start.slice(0, vertexCount);
  const adj = new Int32Array(2 * edgeCount);
  for (let e = 0; e < edgeCount; e++) {
    adj[fill[eu[e]]++] = e;
    adj[fill[ev[e]]++] = e;
  }
  return { start, adj };
}
