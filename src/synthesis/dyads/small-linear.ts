/**
 * Solves the small dense system A·x = b (n ≤ ~6) by Gaussian elimination with partial pivoting; null when a pivot
 * falls below `relativePivot`·max|A| (singular to working precision). A and b are not modified.
 */
export function solveSmall(
  a: readonly (readonly number[])[],
  b: readonly number[],
  relativePivot = 1e-14,
): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  let scale = 0;
  for (const row of a) for (const v of row) scale = Math.max(scale, Math.abs(v));
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  for (let k = 0; k < n; k++) {
    let p = k;
    for (let i = k + 1; i < n; i++) if (Math.abs(m[i]![k]!) > Math.abs(m[p]![k]!)) p = i;
    if (!(Math.abs(m[p]![k]!) > relativePivot * scale)) return null;
    [m[k], m[p]] = [m[p]!, m[k]!];
    const rk = m[k]!;
    for (let i = k + 1; i < n; i++) {
      const ri = m[i]!;
      const f = ri[k]! / rk[k]!;
      for (let j = k; j <= n; j++) ri[j] = ri[j]! - f * rk[j]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    const ri = m[i]!;
    let s = ri[n]!;
    for (let j = i + 1; j < n; j++) s -= ri[j]! * x[j]!;
    x[i] = s / ri[i]!;
  }
  return x;
}

/** Determinant of the 3×3 matrix with rows r0, r1, r2. */
export function det3(r0: readonly number[], r1: readonly number[], r2: readonly number[]): number {
  return (
    r0[0]! * (r1[1]! * r2[2]! - r1[2]! * r2[1]!) -
    r0[1]! * (r1[0]! * r2[2]! - r1[2]! * r2[0]!) +
    r0[2]! * (r1[0]! * r2[1]! - r1[1]! * r2[0]!)
  );
}

/**
 * Real roots of a·t² + b·t + c = 0, ascending, by the cancellation-free form (q = −(b + sign(b)·√D)/2; roots q/a and
 * c/q). A root at infinity (a → 0) is left out; the whole line (a = b = c = 0 relative to `relativeZero`) gives null.
 */
export function quadraticRoots(a: number, b: number, c: number, relativeZero = 1e-14): number[] | null {
  const s = Math.max(Math.abs(a), Math.abs(b), Math.abs(c));
  if (!(s > 0)) return null;
  const an = a / s;
  const bn = b / s;
  const cn = c / s;
  if (Math.abs(an) <= relativeZero && Math.abs(bn) <= relativeZero) return Math.abs(cn) <= relativeZero ? null : [];
  const disc = bn * bn - 4 * an * cn;
  if (disc < 0) return [];
  const q = -0.5 * (bn + (bn >= 0 ? 1 : -1) * Math.sqrt(disc));
  const roots: number[] = [];
  if (an !== 0) roots.push(q / an);
  if (q !== 0) roots.push(cn / q);
  return roots.filter(Number.isFinite).sort((x, y) => x - y);
}
