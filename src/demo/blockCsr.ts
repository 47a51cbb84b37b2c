/**
 * A symmetric sparse stiffness matrix stored as compressed sparse rows of 3×3 node blocks
 * (block CSR): row i of nodes lists its neighbour nodes `col[rowStart[i] .. rowStart[i+1]-1]`
 * in increasing order, and block p holds the 9 numbers `values[9p .. 9p+8]` row-major
 * (dof 3i + r, dof 3·col[p] + c). One block per node pair keeps the column search to once per
 * node pair instead of once per scalar entry, and a node's diagonal block is the natural
 * block-Jacobi preconditioner. Built from element connectivity, assembled without per-entry objects.
 */
export interface BlockCsr {
  readonly nodeCount: number
  readonly rowStart: Int32Array
  readonly col: Int32Array
  readonly values: Float64Array
}

/**
 * Sparsity pattern of an element mesh: node i couples to node j when an element holds both.
 * `conn` holds `nodesPerElement` 0-based node indices per element.
 */
export function createBlockCsr(conn: Int32Array, nodesPerElement: number, nodeCount: number): BlockCsr {
  const elementCount = conn.length / nodesPerElement
  // Node → element incidence, counted then filled.
  const incStart = new Int32Array(nodeCount + 1)
  for (let k = 0; k < conn.length; k++) incStart[conn[k] + 1]++
  for (let i = 0; i < nodeCount; i++) incStart[i + 1] += incStart[i]
  const inc = new Int32Array(conn.length)
  const fill = incStart.slice(0, nodeCount)
  for (let e = 0; e < elementCount; e++) for (let a = 0; a < nodesPerElement; a++) {
    const n = conn[e * nodesPerElement + a]
    inc[fill[n]++] = e
  }
  const marker = new Int32Array(nodeCount).fill(-1)
  const rowStart = new Int32Array(nodeCount + 1)
  // First pass counts distinct neighbours; the second writes them.
  for (let i = 0; i < nodeCount; i++) {
    let count = 0
    for (let q = incStart[i]; q < incStart[i + 1]; q++) {
      const o = inc[q] * nodesPerElement
      for (let b = 0; b < nodesPerElement; b++) {
        const j = conn[o + b]
        if (marker[j] !== i) { marker[j] = i; count++ }
      }
    }
    rowStart[i + 1] = rowStart[i] + count
  }
  const col = new Int32Array(rowStart[nodeCount])
  marker.fill(-1)
  for (let i = 0; i < nodeCount; i++) {
    let p = rowStart[i]
    for (let q = incStart[i]; q < incStart[i + 1]; q++) {
      const o = inc[q] * nodesPerElement
      for (let b = 0; b < nodesPerElement; b++) {
        const j = conn[o + b]
        if (marker[j] !== i) { marker[j] = i; col[p++] = j }
      }
    }
    col.subarray(rowStart[i], rowStart[i + 1]).sort()
  }
  return { nodeCount, rowStart, col, values: new Float64Array(9 * col.length) }
}

/** Block index of (row i, column j), or -1 when the pattern has no such block. */
export function blockIndex(m: BlockCsr, i: number, j: number): number {
  const col = m.col
  // Rows hold at most a few dozen entries: a linear scan beats bisection here.
  for (let p = m.rowStart[i], end = m.rowStart[i + 1]; p < end; p++) if (col[p] === j) return p
  return -1
}

/**
 * Adds an element matrix (row-major, 3·nodes square) into the global matrix.
 * `nodes` are the element's global node indices.
 */
export function addElementMatrix(m: BlockCsr, nodes: Int32Array, ke: Float64Array): void {
  const n = nodes.length, size = 3 * n, v = m.values
  for (let a = 0; a < n; a++) {
    const row = nodes[a]
    for (let b = 0; b < n; b++) {
      const p = 9 * blockIndex(m, row, nodes[b])
      const o = 3 * a * size + 3 * b
      v[p] += ke[o]; v[p + 1] += ke[o + 1]; v[p + 2] += ke[o + 2]
      v[p + 3] += ke[o + size]; v[p + 4] += ke[o + size + 1]; v[p + 5] += ke[o + size + 2]
      v[p + 6] += ke[o + 2 * size]; v[p + 7] += ke[o + 2 * size + 1]; v[p + 8] += ke[o + 2 * size + 2]
    }
  }
}

/** y = A x (vectors of 3·nodeCount). */
export function blockCsrMultiply(y: Float64Array, m: BlockCsr, x: Float64Array): Float64Array {
  const { rowStart, col, values: v, nodeCount } = m
  for (let i = 0; i < nodeCount; i++) {
    let s0 = 0, s1 = 0, s2 = 0
    for (let p = rowStart[i], end = rowStart[i + 1]; p < end; p++) {
      const j = 3 * col[p], o = 9 * p
      const x0 = x[j], x1 = x[j + 1], x2 = x[j + 2]
      s0 += v[o] * x0 + v[o + 1] * x1 + v[o + 2] * x2
      s1 += v[o + 3] * x0 + v[o + 4] * x1 + v[o + 5] * x2
      s2 += v[o + 6] * x0 + v[o + 7] * x1 + v[o + 8] * x2
    }
    y[3 * i] = s0; y[3 * i + 1] = s1; y[3 * i + 2] = s2
  }
  return y
}
