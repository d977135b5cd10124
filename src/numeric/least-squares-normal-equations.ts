import type { JacobianSparsity } from './least-squares-problem.js';

/**
 * The damped normal equations (JᵀJ + λ·D)·h = −Jᵀr of a Levenberg–Marquardt step, in flat row-major `Float64Array`s
 * allocated once per solve and reused by every iteration.
 *
 * - `form` builds JᵀJ (lower triangle) and g = Jᵀr from the nonzeros of each Jacobian row: O(Σᵢ kᵢ²) ≈ O(m·k²) for
 *   k nonzeros per row, plus an O(m·n) scan for zeros when no sparsity pattern is given, instead of O(m·n²).
 *   `formBy` takes them from a problem that sums them itself, with no m×n Jacobian at all.
 * - D is Marquardt's scale diag(JᵀJ), kept as its running maximum over the iterations (Moré, "The Levenberg–Marquardt
 *   algorithm: implementation and theory", Lecture Notes in Mathematics 630, 1978), so a column that shrinks keeps
 *   its damping; a column that has always been zero gets scale 1 (its gradient is zero, so its step is zero).
 * - `factorDamped` is a row-oriented (Cholesky–Banachiewicz) factorisation LLᵀ restricted to the envelope of JᵀJ:
 *   row j of L is zero left of the first nonzero of row j of JᵀJ (George & Liu, *Computer Solution of Large Sparse
 *   Positive Definite Systems*, 1981, §4.1). Work is O(Σⱼ wⱼ²) for envelope widths wⱼ, at most n³/6 when dense; it is
 *   much less when parameters touched by the same residuals are numbered close together and parameters shared by
 *   many residuals come last.
 */
export class LeastSquaresNormalEquations {
  /** Number of parameters. */
  readonly n: number;
  /** JᵀJ, lower triangle in row-major n×n (entry (j, k), k ≤ j, at `normalMatrix[j·n + k]`); upper part unused. */
  readonly normalMatrix: Float64Array;
  /** g = Jᵀr, gradient of ½‖r‖². */
  readonly gradient: Float64Array;
  /** Marquardt's scale D: running maximum of diag(JᵀJ); 0 for a column that has always been zero. */
  readonly scale: Float64Array;
  /**
   * 1 for a parameter held at its value by the next steps (a bound it presses against), else 0: its row and column
   * of the damped system are replaced by the identity and its step is zero. Set by the caller.
   */
  readonly fixed: Uint8Array;
  private readonly factor: Float64Array;
  /** First column of the envelope of row j of JᵀJ (and so of L). */
  private readonly envelopeStart: Int32Array;
  private readonly rowColumns: Int32Array;
  private readonly rowValues: Float64Array;
  private readonly sparsity: JacobianSparsity | undefined;

  /** Allocates the workspace; throws when `sparsity` does not describe an m×n pattern with ascending columns. */
  constructor(n: number, m: number, sparsity?: JacobianSparsity) {
    if (sparsity) checkSparsity(sparsity, n, m);
    this.n = n;
    this.sparsity = sparsity;
    this.normalMatrix = new Float64Array(n * n);
    this.factor = new Float64Array(n * n);
    this.gradient = new Float64Array(n);
    this.scale = new Float64Array(n);
    this.fixed = new Uint8Array(n);
    this.envelopeStart = new Int32Array(n);
    this.rowColumns = new Int32Array(n);
    this.rowValues = new Float64Array(n);
  }

  /**
   * Forms JᵀJ and Jᵀr from the m×n row-major Jacobian and the residuals, and raises the scale D. Returns false when
   * either holds a non-finite value (a non-finite Jacobian entry always shows on the diagonal of JᵀJ).
   */
  form(jacobian: Float64Array, residuals: Float64Array): boolean {
    const { n, normalMatrix: a, gradient: g, envelopeStart, rowColumns: cols, rowValues: vals, sparsity } = this;
    const m = residuals.length;
    a.fill(0);
    g.fill(0);
    for (let j = 0; j < n; j++) envelopeStart[j] = j;
    for (let i = 0; i < m; i++) {
      const base = i * n;
      let k = 0;
      if (sparsity) {
        const end = sparsity.rowStarts[i + 1]!;
        for (let s = sparsity.rowStarts[i]!; s < end; s++) {
          const c = sparsity.columns[s]!;
          cols[k] = c;
          vals[k++] = jacobian[base + c]!;
        }
      } else {
        for (let c = 0; c < n; c++) {
          const v = jacobian[base + c]!;
          // An exact zero contributes nothing to JᵀJ: skipping it is structure, not a tolerance.
          if (v !== 0) {
            cols[k] = c;
            vals[k++] = v;
          }
        }
      }
      if (k === 0) continue;
      const ri = residuals[i]!;
      const first = cols[0]!;
      for (let p = 0; p < k; p++) {
        const cp = cols[p]!;
        const vp = vals[p]!;
        g[cp] = g[cp]! + vp * ri;
        const rowBase = cp * n;
        for (let q = 0; q <= p; q++) {
          const at = rowBase + cols[q]!;
          a[at] = a[at]! + vp * vals[q]!;
        }
        if (first < envelopeStart[cp]!) envelopeStart[cp] = first;
      }
    }
    return this.raiseScale();
  }

  /**
   * Takes JᵀJ and Jᵀr from the problem itself: `fill` adds them into `normalMatrix` (lower triangle) and `gradient`,
   * which it gets zeroed. The envelope is read off the values (Cholesky fills in nothing left of a row's first
   * nonzero, whichever way that zero came about). Raises the scale D; false as for `form`.
   */
  formBy(fill: (normalMatrix: Float64Array, gradient: Float64Array) => void): boolean {
    const { n, normalMatrix: a, gradient: g, envelopeStart } = this;
    a.fill(0);
    g.fill(0);
    fill(a, g);
    for (let j = 0; j < n; j++) {
      const rowJ = j * n;
      let first = 0;
      while (first < j && a[rowJ + first] === 0) first++;
      envelopeStart[j] = first;
    }
    return this.raiseScale();
  }

  /** Raises D to diag(JᵀJ); false when JᵀJ or g holds a non-finite value. */
  private raiseScale(): boolean {
    const { n, normalMatrix: a, gradient: g, scale: d } = this;
    for (let j = 0; j < n; j++) {
      const diagonal = a[j * n + j]!;
      if (!(Number.isFinite(diagonal) && Number.isFinite(g[j]!))) return false;
      if (diagonal > d[j]!) d[j] = diagonal;
    }
    return true;
  }

  /**
   * Factors JᵀJ + λ·D by Cholesky within the envelope. Returns false when a pivot falls to `pivotTolerance` times its
   * damped diagonal entry or below (or is not finite): the damped system is then numerically not positive definite.
   */
  factorDamped(damping: number, pivotTolerance: number): boolean {
    const { n, normalMatrix: a, factor: l, scale: d, envelopeStart, fixed } = this;
    for (let j = 0; j < n; j++) {
      const rowJ = j * n;
      const startJ = envelopeStart[j]!;
      if (fixed[j] === 1) {
        l.fill(0, rowJ + startJ, rowJ + j);
        l[rowJ + j] = 1;
        continue;
      }
      for (let k = startJ; k < j; k++) {
        if (fixed[k] === 1) {
          // Row k of L is the unit row, so the coupling of j to a fixed parameter vanishes.
          l[rowJ + k] = 0;
          continue;
        }
        const rowK = k * n;
        let sum = a[rowJ + k]!;
        for (let i = Math.max(startJ, envelopeStart[k]!); i < k; i++) sum -= l[rowJ + i]! * l[rowK + i]!;
        l[rowJ + k] = sum / l[rowK + k]!;
      }
      const scaleJ = d[j]! > 0 ? d[j]! : 1;
      const dampedDiagonal = a[rowJ + j]! + damping * scaleJ;
      let pivot = dampedDiagonal;
      for (let i = startJ; i < j; i++) pivot -= l[rowJ + i]! * l[rowJ + i]!;
      if (!(pivot > pivotTolerance * dampedDiagonal) || !Number.isFinite(pivot)) return false;
      l[rowJ + j] = Math.sqrt(pivot);
    }
    return true;
  }

  /**
   * Solves (JᵀJ + λ·D)·h = −g with the last successful `factorDamped`, writing h into `step` (length n); fixed
   * parameters get h_j = 0.
   */
  solveStep(step: Float64Array): void {
    const { n, factor: l, gradient: g, envelopeStart, fixed } = this;
    for (let j = 0; j < n; j++) {
      const rowJ = j * n;
      let sum = fixed[j] === 1 ? 0 : -g[j]!;
      for (let i = envelopeStart[j]!; i < j; i++) sum -= l[rowJ + i]! * step[i]!;
      step[j] = sum / l[rowJ + j]!;
    }
    // Lᵀh = y by columns of Lᵀ, i.e. rows of L, so the inner loop stays contiguous.
    for (let j = n - 1; j >= 0; j--) {
      const rowJ = j * n;
      const hj = step[j]! / l[rowJ + j]!;
      step[j] = hj;
      for (let i = envelopeStart[j]!; i < j; i++) step[i] = step[i]! - l[rowJ + i]! * hj;
    }
  }

  /**
   * Decrease of the linear model L(h) = ½‖r + J·h‖² predicted for step `p`: L(0) − L(p) = −pᵀg − ½·pᵀ(JᵀJ)p.
   * Valid for any p, including a step shortened by the bounds.
   */
  predictedReduction(p: Float64Array): number {
    const { n, normalMatrix: a, gradient: g, envelopeStart } = this;
    let linear = 0;
    let quadratic = 0;
    for (let j = 0; j < n; j++) {
      const rowJ = j * n;
      const pj = p[j]!;
      linear += pj * g[j]!;
      let offDiagonal = 0;
      for (let i = envelopeStart[j]!; i < j; i++) offDiagonal += a[rowJ + i]! * p[i]!;
      quadratic += pj * (a[rowJ + j]! * pj + 2 * offDiagonal);
    }
    return -linear - 0.5 * quadratic;
  }
}

function checkSparsity(sparsity: JacobianSparsity, n: number, m: number): void {
  const { rowStarts, columns } = sparsity;
  if (rowStarts.length !== m + 1 || rowStarts[0] !== 0 || rowStarts[m] !== columns.length) {
    throw new Error(
      `jacobianSparsity: rowStarts must have length m + 1 = ${m + 1}, start at 0 and end at columns.length = ${columns.length}`,
    );
  }
  for (let i = 0; i < m; i++) {
    const start = rowStarts[i]!;
    const end = rowStarts[i + 1]!;
    if (!Number.isInteger(start) || end < start) {
      throw new Error(`jacobianSparsity: rowStarts must be non-decreasing integers (row ${i})`);
    }
    for (let s = start; s < end; s++) {
      const c = columns[s]!;
      if (!Number.isInteger(c) || c < 0 || c >= n || (s > start && c <= columns[s - 1]!)) {
        throw new Error(`jacobianSparsity: row ${i} columns must be strictly ascending integers in 0…${n - 1}`);
      }
    }
  }
}
