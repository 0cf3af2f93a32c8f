// Symmetric positive definite matrix in envelope (variable band, "skyline" by rows) storage,
// factored in place as L·Lᵀ. Row i keeps columns firstCol[i] … i of the lower triangle; the
// factor has the same envelope, so no fill is ever allocated outside it.

/** Pivot that is not clearly positive: the caller maps the row to a node and dof. */
export class ZeroPivotError extends Error {
  readonly row: number;
  constructor(row: number) {
    super(`zero pivot in row ${row}`);
    this.name = "ZeroPivotError";
    this.row = row;
  }
}

export class EnvelopeMatrix {
  readonly n: number;
  readonly firstCol: Int32Array;
  /** offset of entry (i, firstCol[i]) in values */
  readonly rowPtr: Int32Array;
  readonly values: Float64Array;

  constructor(firstCol: Int32Array, values?: Float64Array) {
    this.n = firstCol.length;
    this.firstCol = firstCol;
    this.rowPtr = new Int32Array(this.n + 1);
    for (let i = 0; i < this.n; i++) this.rowPtr[i + 1] = this.rowPtr[i]! + (i - firstCol[i]! + 1);
    this.values = values ?? new Float64Array(this.rowPtr[this.n]!);
  }

  clone(): EnvelopeMatrix {
    return new EnvelopeMatrix(this.firstCol, new Float64Array(this.values));
  }

  /** adds v to (i, j) and, by symmetry, (j, i); (i, j) must lie inside the envelope */
  add(i: number, j: number, v: number): void {
    if (j > i) {
      const t = i;
      i = j;
      j = t;
    }
    this.values[this.rowPtr[i]! + j - this.firstCol[i]!]! += v;
  }

  get(i: number, j: number): number {
    if (j > i) {
      const t = i;
      i = j;
      j = t;
    }
    const fc = this.firstCol[i]!;
    if (j < fc) return 0;
    return this.values[this.rowPtr[i]! + j - fc]!;
  }

  diagonal(): Float64Array {
    const d = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) d[i] = this.values[this.rowPtr[i]! + i - this.firstCol[i]!]!;
    return d;
  }

  /** y = A·x for the symmetric matrix */
  multiply(x: Float64Array, y: Float64Array): void {
    y.fill(0);
    const { n, firstCol, rowPtr, values } = this;
    for (let i = 0; i < n; i++) {
      const fc = firstCol[i]!;
      const base = rowPtr[i]! - fc;
      const xi = x[i]!;
      let s = 0;
      for (let j = fc; j < i; j++) {
        const a = values[base + j]!;
        s += a * x[j]!;
        y[j]! += a * xi;
      }
      y[i]! += s + values[base + i]! * xi;
    }
  }
}

/**
 * In-place L·Lᵀ of an envelope matrix. A pivot counts as zero when it is not positive, or
 * when it has lost all but ten digits of `scaleA[i]` or all but thirteen of the row's own
 * diagonal (the second test catches mechanisms hidden under large constraint stiffnesses).
 */
export function factorEnvelope(a: EnvelopeMatrix, scaleA: Float64Array): EnvelopeMatrix {
  const { n, firstCol, rowPtr, values } = a;
  for (let i = 0; i < n; i++) {
    const fi = firstCol[i]!;
    const bi = rowPtr[i]! - fi;
    for (let j = fi; j < i; j++) {
      const fj = firstCol[j]!;
      const bj = rowPtr[j]! - fj;
      let s = values[bi + j]!;
      for (let k = fi > fj ? fi : fj; k < j; k++) s -= values[bi + k]! * values[bj + k]!;
      values[bi + j] = s / values[bj + j]!;
    }
    const diag = values[bi + i]!;
    let s = diag;
    for (let k = fi; k < i; k++) {
      const l = values[bi + k]!;
      s -= l * l;
    }
    if (!(s > 1e-10 * scaleA[i]!) || !(s > 1e-13 * diag)) throw new ZeroPivotError(i);
    values[bi + i] = Math.sqrt(s);
  }
  return a;
}

/** Solves L·Lᵀ·x = b in place (b becomes x). */
export function solveFactored(l: EnvelopeMatrix, b: Float64Array): void {
  const { n, firstCol, rowPtr, values } = l;
  for (let i = 0; i < n; i++) {
    const fi = firstCol[i]!;
    const bi = rowPtr[i]! - fi;
    let s = b[i]!;
    for (let k = fi; k < i; k++) s -= values[bi + k]! * b[k]!;
    b[i] = s / values[bi + i]!;
  }
  for (let i = n - 1; i >= 0; i--) {
    const fi = firstCol[i]!;
    const bi = rowPtr[i]! - fi;
    const xi = b[i]! / values[bi + i]!;
    b[i] = xi;
    for (let k = fi; k < i; k++) b[k]! -= values[bi + k]! * xi;
  }
}
