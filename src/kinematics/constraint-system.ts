import { reverseCuthillMcKee } from '../numeric/index.js';
import type { Mechanism } from './mechanism.js';

/**
 * A mechanism compiled for the hot loop (internal to this folder): flat arrays of joint data, the column of every
 * body coordinate and the row of every equation in a band-narrowing order, and the characteristic length that makes
 * the Jacobian dimensionless.
 *
 * Coordinates (Nikravesh ch. 3): q holds x, y (mm) and φ (rad) of every body in `mechanism.bodies` order, ground
 * included (always 0, 0, 0). The solver's unknowns are x, y and Lc·φ of each moving body, so every Jacobian entry is
 * O(1) and the condition number means something; angle equations are multiplied by Lc, so every residual is in mm.
 *
 * Equation numbering ("natural"): joint k gives equations 2k and 2k + 1; driver d gives equation 2·joints + d.
 */
export interface ConstraintSystem {
  readonly mechanism: Mechanism;
  readonly bodyIndex: ReadonlyMap<string, number>;
  readonly jointIndex: ReadonlyMap<string, number>;
  readonly ground: number;
  readonly nBodies: number;
  /** Unknowns: 3 per moving body. */
  readonly nq: number;
  /** Constraint equations (2 per joint), drivers excluded. */
  readonly nConstraints: number;
  readonly nDrivers: number;
  /** nConstraints + nDrivers. */
  readonly nEquations: number;
  /** True when nEquations = nq: the driven system is square. */
  readonly square: boolean;
  /** Column of each body's x in the solver layout (y and Lc·φ follow); −1 for the die body. */
  readonly col: Int32Array;
  /** Column of each body's x in body order (3 per moving body, die body skipped); −1 for the die body. */
  readonly colNatural: Int32Array;
  /** Characteristic length Lc, mm: mean distance of the joint points of moving bodies from their body origins. */
  readonly scale: number;
  /** 0 revolute, 1 prismatic, per joint. */
  readonly jKind: Uint8Array;
  readonly jI: Int32Array;
  readonly jJ: Int32Array;
  /** 8 numbers per joint: sxI, syI, sxJ, syJ, uxI, uyI (unit axis in I), θ0 = αI − αJ, 0. */
  readonly jData: Float64Array;
  readonly dJoint: Int32Array;
  readonly dOffset: Float64Array;
  /** Natural equation → row of the square (driven) system in band order. */
  readonly rowSquare: Int32Array;
  /** Natural constraint equation → row of the constraint-only Jacobian (identity). */
  readonly rowConstraint: Int32Array;
  /**
   * det(Jacobian in solver layout) = layoutSign × det(Jacobian in natural layout: equations in natural order, columns
   * in body order); ±1.
   */
  readonly layoutSign: 1 | -1;
  /** Sub- and superdiagonal counts of the square system in the solver layout. */
  readonly lower: number;
  readonly upper: number;
}

const cache = new WeakMap<Mechanism, ConstraintSystem>();

/** The compiled form of a (frozen) mechanism, built once and cached. */
export function constraintSystemOf(mechanism: Mechanism): ConstraintSystem {
  let sys = cache.get(mechanism);
  if (!sys) {
    sys = compile(mechanism);
    cache.set(mechanism, sys);
  }
  return sys;
}

function compile(m: Mechanism): ConstraintSystem {
  const bodyIndex = new Map(m.bodies.map((b, i) => [b.id, i] as const));
  const jointIndex = new Map(m.joints.map((j, i) => [j.id, i] as const));
  const ground = m.bodies.findIndex((b) => b.kind === 'die_body');
  const nBodies = m.bodies.length;
  const nJ = m.joints.length;
  const jKind = new Uint8Array(nJ);
  const jI = new Int32Array(nJ);
  const jJ = new Int32Array(nJ);
  const jData = new Float64Array(8 * nJ);
  let armSum = 0;
  let armCount = 0;
  m.joints.forEach((j, k) => {
    jKind[k] = j.kind === 'revolute' ? 0 : 1;
    jI[k] = bodyIndex.get(j.bodyI)!;
    jJ[k] = bodyIndex.get(j.bodyJ)!;
    const o = 8 * k;
    jData[o] = j.pointI[0];
    jData[o + 1] = j.pointI[1];
    jData[o + 2] = j.pointJ[0];
    jData[o + 3] = j.pointJ[1];
    if (j.kind === 'prismatic') {
      const li = Math.hypot(j.axisI[0], j.axisI[1]);
      jData[o + 4] = j.axisI[0] / li;
      jData[o + 5] = j.axisI[1] / li;
      jData[o + 6] = Math.atan2(j.axisI[1], j.axisI[0]) - Math.atan2(j.axisJ[1], j.axisJ[0]);
    }
    for (const [b, p] of [
      [jI[k]!, j.pointI],
      [jJ[k]!, j.pointJ],
    ] as const) {
      const r = Math.hypot(p[0], p[1]);
      if (b !== ground && r > 0) {
        armSum += r;
        armCount++;
      }
    }
  });
  const scale = armCount > 0 ? armSum / armCount : 1;
  const nDrivers = m.drivers.length;
  const dJoint = new Int32Array(nDrivers);
  const dOffset = new Float64Array(nDrivers);
  m.drivers.forEach((d, i) => {
    dJoint[i] = jointIndex.get(d.joint)!;
    dOffset[i] = d.offset;
  });
  const nq = 3 * (nBodies - 1);
  const nConstraints = 2 * nJ;
  const nEquations = nConstraints + nDrivers;

  // Columns: moving bodies in reverse Cuthill–McKee order of the joint graph with the die body removed.
  const moving: number[] = [];
  const slot = new Int32Array(nBodies).fill(-1);
  for (let b = 0; b < nBodies; b++) {
    if (b !== ground) {
      slot[b] = moving.length;
      moving.push(b);
    }
  }
  const adjacency: number[][] = moving.map(() => []);
  for (let k = 0; k < nJ; k++) {
    const si = slot[jI[k]!]!;
    const sj = slot[jJ[k]!]!;
    if (si >= 0 && sj >= 0) {
      adjacency[si]!.push(sj);
      adjacency[sj]!.push(si);
    }
  }
  const order = reverseCuthillMcKee(adjacency);
  const position = new Int32Array(nBodies).fill(-1);
  order.forEach((s, pos) => {
    position[moving[s]!] = pos;
  });
  const col = new Int32Array(nBodies).fill(-1);
  for (let b = 0; b < nBodies; b++) if (position[b]! >= 0) col[b] = 3 * position[b]!;
  const colNatural = new Int32Array(nBodies).fill(-1);
  for (let b = 0; b < nBodies; b++) if (slot[b]! >= 0) colNatural[b] = 3 * slot[b]!;

  // Rows: try a few sort keys on the body positions each equation touches and keep the narrowest band.
  const lo = new Int32Array(nEquations);
  const hi = new Int32Array(nEquations);
  for (let e = 0; e < nEquations; e++) {
    const k = e < nConstraints ? e >> 1 : dJoint[e - nConstraints]!;
    const pi = position[jI[k]!]!;
    const pj = position[jJ[k]!]!;
    const ps = [pi, pj].filter((p) => p >= 0);
    lo[e] = ps.length > 0 ? Math.min(...ps) : 0;
    hi[e] = ps.length > 0 ? Math.max(...ps) : 0;
  }
  const natural = Array.from({ length: nEquations }, (_, e) => e);
  const candidates = [
    natural,
    [...natural].sort((x, y) => hi[x]! - hi[y]! || lo[x]! - lo[y]! || x - y),
    [...natural].sort((x, y) => lo[x]! - lo[y]! || hi[x]! - hi[y]! || x - y),
    [...natural].sort((x, y) => lo[x]! + hi[x]! - lo[y]! - hi[y]! || x - y),
  ];
  let best = { rows: natural, lower: nq, upper: nq, cost: Number.POSITIVE_INFINITY };
  for (const rows of candidates) {
    let lower = 0;
    let upper = 0;
    rows.forEach((e, r) => {
      lower = Math.max(lower, r - 3 * lo[e]!);
      upper = Math.max(upper, 3 * hi[e]! + 2 - r);
    });
    lower = Math.min(lower, Math.max(0, nq - 1));
    upper = Math.min(upper, Math.max(0, nq - 1));
    const cost = lower * (lower + upper + 1);
    if (cost < best.cost) best = { rows, lower, upper, cost };
  }
  const rowSquare = new Int32Array(nEquations);
  best.rows.forEach((e, r) => {
    rowSquare[e] = r;
  });
  // Swapping two 3-column blocks is three transpositions, so the column parity is that of the body order.
  const parity = permutationParity(Array.from(rowSquare)) * permutationParity(order);
  const layoutSign: 1 | -1 = parity > 0 ? 1 : -1;
  const rowConstraint = Int32Array.from({ length: nConstraints }, (_, e) => e);

  return {
    mechanism: m,
    bodyIndex,
    jointIndex,
    ground,
    nBodies,
    nq,
    nConstraints,
    nDrivers,
    nEquations,
    square: nEquations === nq,
    col,
    colNatural,
    scale,
    jKind,
    jI,
    jJ,
    jData,
    dJoint,
    dOffset,
    rowSquare,
    rowConstraint,
    layoutSign,
    lower: best.lower,
    upper: best.upper,
  };
}

function permutationParity(perm: readonly number[]): number {
  const seen = new Uint8Array(perm.length);
  let parity = 1;
  for (let i = 0; i < perm.length; i++) {
    if (seen[i]) continue;
    let length = 0;
    for (let j = i; !seen[j]; j = perm[j]!) {
      seen[j] = 1;
      length++;
    }
    if (length % 2 === 0) parity = -parity;
  }
  return parity;
}

/** Fills cos φ and sin φ of every body from q (3 per body). */
export function updateTrig(sys: ConstraintSystem, q: Float64Array, cs: Float64Array, sn: Float64Array): void {
  for (let b = 0; b < sys.nBodies; b++) {
    const phi = q[3 * b + 2]!;
    cs[b] = Math.cos(phi);
    sn[b] = Math.sin(phi);
  }
}

/**
 * Scaled constraint residuals Φ(q) (mm) into `out[row[e]]`; driver equations too when `actuators` is given. Returns
 * the max-norm.
 */
export function evaluateResidual(
  sys: ConstraintSystem,
  q: Float64Array,
  cs: Float64Array,
  sn: Float64Array,
  actuators: ArrayLike<number> | null,
  row: Int32Array,
  out: Float64Array,
): number {
  const { jKind, jI, jJ, jData, scale } = sys;
  const nJ = jKind.length;
  let norm = 0;
  for (let k = 0; k < nJ; k++) {
    const i = jI[k]!;
    const j = jJ[k]!;
    const o = 8 * k;
    const ci = cs[i]!;
    const si = sn[i]!;
    const cj = cs[j]!;
    const sj = sn[j]!;
    const sxi = jData[o]!;
    const syi = jData[o + 1]!;
    const sxj = jData[o + 2]!;
    const syj = jData[o + 3]!;
    const pix = q[3 * i]! + ci * sxi - si * syi;
    const piy = q[3 * i + 1]! + si * sxi + ci * syi;
    const pjx = q[3 * j]! + cj * sxj - sj * syj;
    const pjy = q[3 * j + 1]! + sj * sxj + cj * syj;
    let r0: number;
    let r1: number;
    if (jKind[k] === 0) {
      r0 = pix - pjx;
      r1 = piy - pjy;
    } else {
      const ux = jData[o + 4]!;
      const uy = jData[o + 5]!;
      const ex = ci * ux - si * uy;
      const ey = si * ux + ci * uy;
      r0 = scale * (q[3 * j + 2]! - q[3 * i + 2]! - jData[o + 6]!);
      r1 = -ey * (pjx - pix) + ex * (pjy - piy);
    }
    out[row[2 * k]!] = r0;
    out[row[2 * k + 1]!] = r1;
    const a0 = Math.abs(r0);
    const a1 = Math.abs(r1);
    if (a0 > norm) norm = a0;
    if (a1 > norm) norm = a1;
  }
  if (actuators) {
    const base = 2 * nJ;
    for (let d = 0; d < sys.nDrivers; d++) {
      const r = driverResidual(sys, q, cs, sn, d, actuators[d]!);
      out[row[base + d]!] = r;
      const a = Math.abs(r);
      if (a > norm) norm = a;
    }
  }
  return norm;
}

/** Scaled residual of driver d: joint value − actuator − offset (× Lc for angles), mm. */
function driverResidual(
  sys: ConstraintSystem,
  q: Float64Array,
  cs: Float64Array,
  sn: Float64Array,
  d: number,
  actuator: number,
): number {
  const k = sys.dJoint[d]!;
  const target = actuator + sys.dOffset[d]!;
  const i = sys.jI[k]!;
  const j = sys.jJ[k]!;
  if (sys.jKind[k] === 0) return sys.scale * (q[3 * j + 2]! - q[3 * i + 2]! - target);
  return jointTravel(sys, q, cs, sn, k) - target;
}

/** Travel of prismatic joint k: (Pj − Pi) along the unit axis of body I, mm. */
export function jointTravel(
  sys: ConstraintSystem,
  q: Float64Array,
  cs: Float64Array,
  sn: Float64Array,
  k: number,
): number {
  const { jI, jJ, jData } = sys;
  const i = jI[k]!;
  const j = jJ[k]!;
  const o = 8 * k;
  const ci = cs[i]!;
  const si = sn[i]!;
  const cj = cs[j]!;
  const sj = sn[j]!;
  const dx = q[3 * j]! + cj * jData[o + 2]! - sj * jData[o + 3]! - (q[3 * i]! + ci * jData[o]! - si * jData[o + 1]!);
  const dy =
    q[3 * j + 1]! + sj * jData[o + 2]! + cj * jData[o + 3]! - (q[3 * i + 1]! + si * jData[o]! + ci * jData[o + 1]!);
  const ux = jData[o + 4]!;
  const uy = jData[o + 5]!;
  return (ci * ux - si * uy) * dx + (si * ux + ci * uy) * dy;
}

/**
 * Writes the scaled Jacobian ∂Φ/∂(x, y, Lc·φ) into `a`, entry (r, c) at `r * stride + offset + c`, at rows `row[e]` and the
 * columns `col` (default: the solver layout); driver rows too when `withDrivers`. Entries not written are left as they are (clear first).
 */
export function assembleJacobian(
  sys: ConstraintSystem,
  q: Float64Array,
  cs: Float64Array,
  sn: Float64Array,
  withDrivers: boolean,
  row: Int32Array,
  a: Float64Array,
  stride: number,
  col: Int32Array = sys.col,
  offset = 0,
): void {
  const { jKind, jI, jJ, jData, scale } = sys;
  const inv = 1 / scale;
  const nJ = jKind.length;
  const nEq = withDrivers ? nJ + sys.nDrivers : nJ;
  for (let t = 0; t < nEq; t++) {
    const isDriver = t >= nJ;
    const k = isDriver ? sys.dJoint[t - nJ]! : t;
    const i = jI[k]!;
    const j = jJ[k]!;
    const ci0 = col[i]!;
    const cj0 = col[j]!;
    const o = 8 * k;
    const ci = cs[i]!;
    const si = sn[i]!;
    const cj = cs[j]!;
    const sj = sn[j]!;
    // Body-fixed vectors from each origin to the joint point, in the die-body frame.
    const aix = ci * jData[o]! - si * jData[o + 1]!;
    const aiy = si * jData[o]! + ci * jData[o + 1]!;
    const ajx = cj * jData[o + 2]! - sj * jData[o + 3]!;
    const ajy = sj * jData[o + 2]! + cj * jData[o + 3]!;
    if (!isDriver) {
      const r0 = row[2 * k]! * stride + offset;
      const r1 = row[2 * k + 1]! * stride + offset;
      if (jKind[k] === 0) {
        if (ci0 >= 0) {
          a[r0 + ci0] = 1;
          a[r0 + ci0 + 2] = -aiy * inv;
          a[r1 + ci0 + 1] = 1;
          a[r1 + ci0 + 2] = aix * inv;
        }
        if (cj0 >= 0) {
          a[r0 + cj0] = -1;
          a[r0 + cj0 + 2] = ajy * inv;
          a[r1 + cj0 + 1] = -1;
          a[r1 + cj0 + 2] = -ajx * inv;
        }
      } else {
        const ux = jData[o + 4]!;
        const uy = jData[o + 5]!;
        const ex = ci * ux - si * uy;
        const ey = si * ux + ci * uy;
        const nx = -ey;
        const ny = ex;
        const dx = q[3 * j]! + ajx - q[3 * i]! - aix;
        const dy = q[3 * j + 1]! + ajy - q[3 * i + 1]! - aiy;
        if (ci0 >= 0) {
          a[r0 + ci0 + 2] = -1;
          a[r1 + ci0] = -nx;
          a[r1 + ci0 + 1] = -ny;
          a[r1 + ci0 + 2] = (-(ex * dx + ey * dy) - (nx * -aiy + ny * aix)) * inv;
        }
        if (cj0 >= 0) {
          a[r0 + cj0 + 2] = 1;
          a[r1 + cj0] = nx;
          a[r1 + cj0 + 1] = ny;
          a[r1 + cj0 + 2] = (nx * -ajy + ny * ajx) * inv;
        }
      }
    } else {
      const r0 = row[2 * nJ + (t - nJ)]! * stride + offset;
      if (jKind[k] === 0) {
        if (ci0 >= 0) a[r0 + ci0 + 2] = -1;
        if (cj0 >= 0) a[r0 + cj0 + 2] = 1;
      } else {
        const ux = jData[o + 4]!;
        const uy = jData[o + 5]!;
        const ex = ci * ux - si * uy;
        const ey = si * ux + ci * uy;
        const dx = q[3 * j]! + ajx - q[3 * i]! - aix;
        const dy = q[3 * j + 1]! + ajy - q[3 * i + 1]! - aiy;
        if (ci0 >= 0) {
          a[r0 + ci0] = -ex;
          a[r0 + ci0 + 1] = -ey;
          a[r0 + ci0 + 2] = (-ey * dx + ex * dy - (ex * -aiy + ey * aix)) * inv;
        }
        if (cj0 >= 0) {
          a[r0 + cj0] = ex;
          a[r0 + cj0 + 1] = ey;
          a[r0 + cj0 + 2] = (ex * -ajy + ey * ajx) * inv;
        }
      }
    }
  }
}

/** Scaled right-hand side of the velocity equations for a unit rate of driver d: Lc for angles, 1 for travel. */
export function driverRate(sys: ConstraintSystem, d: number): number {
  return sys.jKind[sys.dJoint[d]!] === 0 ? sys.scale : 1;
}
