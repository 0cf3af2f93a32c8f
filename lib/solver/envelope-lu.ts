/**
 * Gaussian elimination with row pivoting on a sparse, locality-ordered matrix stored as
 * row envelopes (each row a dense run from its first to its last nonzero column).
 * Columns are taken in order; a column with no usable pivot left depends on the earlier
 * ones and is reported as dependent (for the equilibrium matrix: a redundant). Rows never
 * pivoted are dependent rows (for the equilibrium matrix: a mechanism).
 * Cost is O(n·b²) for bandwidth b; every later solve is O(n·b).
 */

/** Compressed by column: column j holds rows[ptr[j] … ptr[j+1]) with values vals[…]. */
export interface SparseColumns {
  nRows: number;
  ptr: Int32Array;
  rows: Int32Array;
  vals: Float64Array;
}

export class EnvelopeLU {
  readonly nRows: number;
  readonly nCols: number;
  /** pivot row of each column, −1 for a dependent column */
  readonly pivotRow: Int32Array;
  readonly dependentColumns: number[] = [];
  readonly dependentRows: number[] = [];
  // Every row's run lives in one pooled buffer (tens of thousands of small arrays would
  // cost more in allocation than the elimination itself): row i covers columns
  // [start[i], end[i]) at pool[off[i] …], with room for cap[i] entries before it moves.
  private pool: Float64Array;
  private poolEnd: number;
  private readonly start: Int32Array;
  private readonly end: Int32Array;
  private readonly off: Int32Array;
  private readonly cap: Int32Array;
  private opRow: Int32Array;
  private opPivot: Int32Array;
  private opFactor: Float64Array;
  private nOps = 0;

  constructor(a: SparseColumns, relTol = 1e-10) {
    const nCols = a.ptr.length - 1;
    const nRows = a.nRows;
    this.nRows = nRows;
    this.nCols = nCols;
    this.pivotRow = new Int32Array(nCols).fill(-1);
    this.start = new Int32Array(nRows).fill(nCols);
    this.end = new Int32Array(nRows);
    this.off = new Int32Array(nRows);
    this.cap = new Int32Array(nRows);
    const colNorm = new Float64Array(nCols);
    for (let j = 0; j < nCols; j++) {
      for (let t = a.ptr[j] ?? 0; t < (a.ptr[j + 1] ?? 0); t++) {
        const i = a.rows[t] ?? 0;
        if (j < (this.start[i] ?? 0)) this.start[i] = j;
        if (j + 1 > (this.end[i] ?? 0)) this.end[i] = j + 1;
        colNorm[j] = Math.max(colNorm[j] ?? 0, Math.abs(a.vals[t] ?? 0));
      }
    }
    // Fill stays inside the band, so twice a row's first width is nearly always room enough.
    let total = 0;
    for (let i = 0; i < nRows; i++) {
      if ((this.end[i] ?? 0) === 0) this.end[i] = nCols; // an empty row: never active, always dependent
      const width = Math.max(0, (this.end[i] ?? 0) - (this.start[i] ?? 0));
      this.off[i] = total;
      this.cap[i] = 2 * width + 4;
      total += this.cap[i] ?? 0;
    }
    this.pool = new Float64Array(Math.max(16, total));
    this.poolEnd = total;
    for (let j = 0; j < nCols; j++) {
      for (let t = a.ptr[j] ?? 0; t < (a.ptr[j + 1] ?? 0); t++) {
        const i = a.rows[t] ?? 0;
        const at = (this.off[i] ?? 0) + j - (this.start[i] ?? 0);
        this.pool[at] = (this.pool[at] ?? 0) + (a.vals[t] ?? 0);
      }
    }
    this.opRow = new Int32Array(Math.max(16, 4 * nRows));
    this.opPivot = new Int32Array(this.opRow.length);
    this.opFactor = new Float64Array(this.opRow.length);

    const byStart = Array.from({ length: nRows }, (_, i) => i).sort((x, y) => (this.start[x] ?? 0) - (this.start[y] ?? 0) || x - y);
    const active: number[] = [];
    let next = 0;
    for (let j = 0; j < nCols; j++) {
      while (next < byStart.length && (this.start[byStart[next] ?? 0] ?? 0) <= j) active.push(byStart[next++] ?? 0);
      let p = -1;
      let best = 0;
      let at = -1;
      for (let k = 0; k < active.length; k++) {
        const r = active[k] ?? 0;
        const v = Math.abs(this.get(r, j));
        if (v > best) {
          best = v;
          p = r;
          at = k;
        }
      }
      if (p < 0 || best <= relTol * (colNorm[j] ?? 0)) {
        this.dependentColumns.push(j);
        for (const r of active) this.set(r, j, 0);
        continue;
      }
      this.pivotRow[j] = p;
      const piv = this.get(p, j);
      active.splice(at, 1);
      for (const r of active) {
        const v = this.get(r, j);
        if (v === 0) continue;
        const f = v / piv;
        this.pushOp(r, p, f);
        const pEnd = this.end[p] ?? 0;
        this.grow(r, pEnd);
        // after grow: both offsets are current (grow may move row r, never row p)
        const ro = (this.off[r] ?? 0) - (this.start[r] ?? 0);
        const po = (this.off[p] ?? 0) - (this.start[p] ?? 0);
        const pool = this.pool;
        for (let k = j + 1; k < pEnd; k++) pool[ro + k] = (pool[ro + k] ?? 0) - f * (pool[po + k] ?? 0);
        pool[ro + j] = 0;
      }
    }
    const pivoted = new Uint8Array(nRows);
    for (const r of this.pivotRow) if (r >= 0) pivoted[r] = 1;
    for (let i = 0; i < nRows; i++) if (!pivoted[i]) this.dependentRows.push(i);
  }

  private get(i: number, j: number): number {
    const s = this.start[i] ?? 0;
    return j >= s && j < (this.end[i] ?? 0) ? (this.pool[(this.off[i] ?? 0) + j - s] ?? 0) : 0;
  }

  private set(i: number, j: number, v: number): void {
    const s = this.start[i] ?? 0;
    if (j >= s && j < (this.end[i] ?? 0)) this.pool[(this.off[i] ?? 0) + j - s] = v;
  }

  /** Extends row i to column `end` (exclusive), moving it to fresh pool space if it is full. */
  private grow(i: number, end: number): void {
    if (end <= (this.end[i] ?? 0)) return;
    const s = this.start[i] ?? 0;
    const need = end - s;
    if (need > (this.cap[i] ?? 0)) {
      const cap = Math.max(need, 2 * (this.cap[i] ?? 0));
      if (this.poolEnd + cap > this.pool.length) {
        const bigger = new Float64Array(Math.max(2 * this.pool.length, this.poolEnd + cap));
        bigger.set(this.pool);
        this.pool = bigger;
      }
      const from = this.off[i] ?? 0;
      this.pool.copyWithin(this.poolEnd, from, from + ((this.end[i] ?? 0) - s));
      this.off[i] = this.poolEnd;
      this.cap[i] = cap;
      this.poolEnd += cap;
    }
    this.end[i] = end;
  }

  /** row operations recorded by the elimination (a measure of its cost: O(n·b) for a band b) */
  get operations(): number {
    return this.nOps;
  }

  /** widest row envelope after fill, in columns (the band the elimination worked in) */
  get widestRow(): number {
    let w = 0;
    for (let i = 0; i < this.nRows; i++) w = Math.max(w, (this.end[i] ?? 0) - (this.start[i] ?? 0));
    return w;
  }

  private pushOp(r: number, p: number, f: number): void {
    if (this.nOps === this.opRow.length) {
      const grow = <T extends Int32Array | Float64Array>(a: T, make: (n: number) => T): T => {
        const b = make(a.length * 2);
        b.set(a);
        return b;
      };
      this.opRow = grow(this.opRow, (n) => new Int32Array(n));
      this.opPivot = grow(this.opPivot, (n) => new Int32Array(n));
      this.opFactor = grow(this.opFactor, (n) => new Float64Array(n));
    }
    this.opRow[this.nOps] = r;
    this.opPivot[this.nOps] = p;
    this.opFactor[this.nOps] = f;
    this.nOps++;
  }

  /**
   * Solves A x = b for the independent columns with the dependent columns' values given
   * in `x` beforehand (they are read, not written). `b` is overwritten.
   */
  solve(b: Float64Array, x: Float64Array): void {
    for (let k = 0; k < this.nOps; k++) {
      const r = this.opRow[k] ?? 0;
      b[r] = (b[r] ?? 0) - (this.opFactor[k] ?? 0) * (b[this.opPivot[k] ?? 0] ?? 0);
    }
    const pool = this.pool;
    for (let j = this.nCols - 1; j >= 0; j--) {
      const p = this.pivotRow[j] ?? -1;
      if (p < 0) continue;
      const o = (this.off[p] ?? 0) - (this.start[p] ?? 0);
      const e = this.end[p] ?? 0;
      let sum = b[p] ?? 0;
      for (let k = j + 1; k < e; k++) sum -= (pool[o + k] ?? 0) * (x[k] ?? 0);
      x[j] = sum / (pool[o + j] ?? 1);
    }
  }

  /**
   * Solves A_bᵀ z = g, A_b being the independent columns: `g` is indexed by column (entries of
   * dependent columns are ignored) and is overwritten; z (indexed by row) is returned.
   */
  solveTransposed(g: Float64Array): Float64Array {
    const w = new Float64Array(this.nRows);
    const pool = this.pool;
    for (let j = 0; j < this.nCols; j++) {
      const p = this.pivotRow[j] ?? -1;
      if (p < 0) continue;
      const o = (this.off[p] ?? 0) - (this.start[p] ?? 0);
      const e = this.end[p] ?? 0;
      const wj = (g[j] ?? 0) / (pool[o + j] ?? 1);
      w[p] = wj;
      if (wj === 0) continue;
      for (let k = j + 1; k < e; k++) g[k] = (g[k] ?? 0) - (pool[o + k] ?? 0) * wj;
    }
    this.applyTransposedOps(w);
    return w;
  }

  /** A left null vector yᵀA = 0 with y = 1 at the dependent row `row` (a mechanism shape). */
  leftNullVector(row: number): Float64Array {
    const y = new Float64Array(this.nRows);
    y[row] = 1;
    this.applyTransposedOps(y);
    return y;
  }

  private applyTransposedOps(w: Float64Array): void {
    for (let k = this.nOps - 1; k >= 0; k--) {
      const r = this.opRow[k] ?? 0;
      const wr = w[r] ?? 0;
      if (wr === 0) continue;
      const p = this.opPivot[k] ?? 0;
      w[p] = (w[p] ?? 0) - (this.opFactor[k] ?? 0) * wr;
    }
  }
}
