import type { Point } from '../geometry/index.js';
import type { ChainEnd, PlateChain } from './plate-chain.js';

/** How each chain end is held while fitting. */
export type EndKind = 'pivot' | 'slot';

/**
 * The chain fit as a least-squares problem (Murray, Schmiedeler & Korte, J. Mech. Des. 130(3) 032302, 2008: common
 * pivot-to-pivot lengths, per-station configurations). Unknowns, in order:
 *   plate angles θ_k,i (per station);  plate lengths L_k (common);
 *   start end: pivot (x, y) | slot (x, y, ψ, travel per station);  end end: the same.
 * Station i's pivots: P_0 = start pin, P_k = P_{k−1} + L_k·(cos θ_k,i, sin θ_k,i).
 * Residuals: for every span sample q, dist(q, pivot polyline) − e (zero when q lies on the plates' swollen melt edge,
 * docs/MODEL.md §2); W·(P_N − end pin) per station (closure); weak ties of each end's position to its start value (they
 * fix the gauge when a straight end plate could slide along itself).
 */
export interface ChainProblemSpec {
  /** Span samples per station, mm. */
  readonly samples: readonly (readonly Point[])[];
  readonly plateCount: number;
  /** e, mm. */
  readonly edgeOffsetMm: number;
  readonly startKind: EndKind;
  readonly endKind: EndKind;
  /** Where each end's position is weakly tied, mm. */
  readonly startAnchor: Point;
  readonly endAnchor: Point;
  /** Closure weight (dimensionless). @default 30 */
  readonly closureWeight?: number;
  /** Anchor weight (dimensionless). @default 1e-4 */
  readonly anchorWeight?: number;
  /**
   * Misses larger than this weigh more than squares: each sample residual r becomes r + r³/τ², so a least-squares
   * solve stops trading one large miss for many small ones (the fit is judged by its largest deviation). mm; 0 or
   * absent for plain least squares.
   */
  readonly emphasisMm?: number;
  /**
   * Plates whose length may change from station to station (a telescoping plate pair: two plates joined by a
   * prismatic joint; Shamsudin et al., Mech. Mach. Theory 70, 2013). Each gets its own length per station; its common
   * length is tied to their mean. @default none
   */
  readonly telescoping?: readonly number[];
  /**
   * Points of the die-body boundary per station that the plates must not come closer to than e (they would cover the
   * melt channel there): a one-sided residual w·min(0, dist − e). mm. @default none
   */
  readonly keepOut?: readonly (readonly Point[])[];
  /** Weight of the keep-out residuals (dimensionless). @default 3 */
  readonly keepOutWeight?: number;
  /**
   * Per-station weights of the span samples, same shape as `samples` (dimensionless). Shaped edges use them: the
   * middle of a plate is the edge's business, its ends (round, centred on the pivots) the pivots'. @default all 1
   */
  readonly sampleWeights?: readonly (readonly number[])[];
}

export interface ChainLayout {
  readonly stationCount: number;
  readonly plateCount: number;
  readonly start: number;
  readonly startSize: number;
  readonly end: number;
  readonly endSize: number;
  readonly lengths: number;
  readonly angles: number;
  /** First per-station length of a telescoping plate: plate `telescoping[t]` at station i is at
   * `extensions + t·stationCount + i`. */
  readonly extensions: number;
  readonly telescoping: readonly number[];
  readonly parameterCount: number;
  readonly residualCount: number;
}

/** Parameter index of telescoping plate k's length at station i, or −1 when plate k is rigid. */
export function extensionIndex(layout: ChainLayout, k: number, station: number): number {
  const t = layout.telescoping.indexOf(k);
  return t < 0 ? -1 : layout.extensions + t * layout.stationCount + station;
}

/** Pivot-to-pivot length of plate k at station i, mm. */
export function plateLength(x: Float64Array, layout: ChainLayout, k: number, station: number): number {
  const ext = extensionIndex(layout, k, station);
  return ext < 0 ? x[layout.lengths + k]! : x[ext]!;
}

export function chainLayout(spec: ChainProblemSpec): ChainLayout {
  const s = spec.samples.length;
  const n = spec.plateCount;
  const startSize = spec.startKind === 'pivot' ? 2 : 3 + s;
  const endSize = spec.endKind === 'pivot' ? 2 : 3 + s;
  // per-station angles first, shared unknowns last: JᵀJ is then block-diagonal with a dense border, and the envelope
  // Cholesky does little more than the blocks
  const angles = 0;
  const lengths = angles + n * s;
  const start = lengths + n;
  const end = start + startSize;
  const telescoping = [...(spec.telescoping ?? [])];
  const extensions = end + endSize;
  const sampleCount =
    spec.samples.reduce((k, q) => k + q.length, 0) + (spec.keepOut ?? []).reduce((k, q) => k + q.length, 0);
  return {
    stationCount: s,
    plateCount: n,
    start,
    startSize,
    end,
    endSize,
    lengths,
    angles,
    extensions,
    telescoping,
    parameterCount: extensions + telescoping.length * s,
    residualCount: sampleCount + 2 * s + 4 + telescoping.length,
  };
}

/** Pin position of an end at station i from the parameter vector, and its derivative columns. */
function pin(x: Float64Array, offset: number, kind: EndKind, station: number): Point {
  if (kind === 'pivot') return [x[offset]!, x[offset + 1]!];
  const psi = x[offset + 2]!;
  const t = x[offset + 3 + station]!;
  return [x[offset]! + t * Math.cos(psi), x[offset + 1]! + t * Math.sin(psi)];
}

/** Pivot positions of station i (N + 1 points) into `px`, `py`. */
export function stationPivots(
  x: Float64Array,
  layout: ChainLayout,
  spec: ChainProblemSpec,
  station: number,
  px: Float64Array,
  py: Float64Array,
): void {
  const p0 = pin(x, layout.start, spec.startKind, station);
  px[0] = p0[0];
  py[0] = p0[1];
  const n = layout.plateCount;
  for (let k = 0; k < n; k++) {
    const len = plateLength(x, layout, k, station);
    const th = x[layout.angles + station * n + k]!;
    px[k + 1] = px[k]! + len * Math.cos(th);
    py[k + 1] = py[k]! + len * Math.sin(th);
  }
}

/**
 * Builds the least-squares callbacks: `residuals`, the Jacobian dense (`jacobian`), and JᵀJ with Jᵀr summed directly
 * (`normalEquations`, what the fit uses).
 *
 * Why JᵀJ is summed here: a sample residual depends on the parameters only through the two pivots of its nearest
 * plate k, and every parameter moves a whole tail of pivots rigidly (the start pin all of them, plate l's angle and
 * length P_{l+1} … P_N, each along one direction d). Its Jacobian entry is therefore d · G(s) with G(s) the pull on
 * the pivots from the parameter's first one on: h (the pulls on P_k and P_{k+1} together) up to P_k, g (the pull on
 * P_{k+1}) at P_{k+1}, nothing beyond. Summing h·hᵀ, h·gᵀ, g·gᵀ per station and nearest plate, then contracting with
 * the directions, costs O(rows + parameters²) per station instead of O(rows · nonzeros²).
 */
export function makeChainProblem(spec: ChainProblemSpec) {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const stations = layout.stationCount;
  const columnCount = layout.parameterCount;
  const e = spec.edgeOffsetMm;
  const w = spec.closureWeight ?? 30;
  const wa = spec.anchorWeight ?? 1e-4;
  const tau = spec.emphasisMm ?? 0;
  const wk = spec.keepOutWeight ?? 3;
  // read once: specs come in several shapes (spread with and without the optional fields), and reading them inside
  // the loops would make every such read polymorphic
  const { samples, sampleWeights, startKind, endKind, startAnchor, endAnchor } = spec;
  const keepOut = spec.keepOut ?? samples.map(() => []);
  const inv2 = tau > 0 ? 1 / (tau * tau) : 0;
  /** Per plate: its index in `layout.telescoping`, or −1 when rigid. */
  const telescopingSlot = Int32Array.from({ length: n }, (_, k) => layout.telescoping.indexOf(k));

  // The chain at the last x seen: station i's pivots at i·(n + 1) …, plate k's direction and length at i·n + k, and
  // for every sample and keep-out row its nearest plate, the position t along it and the distance. The solver asks
  // for the Jacobian where it last evaluated the residuals, so the projections (the costly part) are found once.
  const seen = new Float64Array(columnCount).fill(Number.NaN);
  const px = new Float64Array(stations * (n + 1));
  const py = new Float64Array(stations * (n + 1));
  const cos = new Float64Array(stations * n);
  const sin = new Float64Array(stations * n);
  const len = new Float64Array(stations * n);
  const nearPlate = new Int32Array(layout.residualCount);
  const nearT = new Float64Array(layout.residualCount);
  const nearDistance = new Float64Array(layout.residualCount);

  /** Nearest plate of a station's pivot polyline (its pivots from `base`) to q, into the row's slots. */
  const project = (qx: number, qy: number, base: number, row: number): void => {
    let best = Number.POSITIVE_INFINITY;
    let plate = 0;
    let bestT = 0;
    for (let k = 0; k < n; k++) {
      const ax = px[base + k]!;
      const ay = py[base + k]!;
      const dx = px[base + k + 1]! - ax;
      const dy = py[base + k + 1]! - ay;
      const l2 = dx * dx + dy * dy;
      let t = l2 > 0 ? ((qx - ax) * dx + (qy - ay) * dy) / l2 : 0;
      t = t < 0 ? 0 : Math.min(t, 1);
      const ex = ax + t * dx - qx;
      const ey = ay + t * dy - qy;
      const d2 = ex * ex + ey * ey;
      if (d2 < best) {
        best = d2;
        plate = k;
        bestT = t;
      }
    }
    nearPlate[row] = plate;
    nearT[row] = bestT;
    nearDistance[row] = Math.sqrt(best);
  };

  const poseAt = (x: Float64Array): void => {
    let same = true;
    for (let j = 0; j < columnCount && same; j++) same = x[j] === seen[j];
    if (same) return;
    seen.set(x);
    let row = 0;
    for (let i = 0; i < stations; i++) {
      const base = i * (n + 1);
      const p0 = pin(x, layout.start, startKind, i);
      px[base] = p0[0];
      py[base] = p0[1];
      for (let k = 0; k < n; k++) {
        const l = plateLength(x, layout, k, i);
        const th = x[layout.angles + i * n + k]!;
        const c = Math.cos(th);
        const s = Math.sin(th);
        cos[i * n + k] = c;
        sin[i * n + k] = s;
        len[i * n + k] = l;
        px[base + k + 1] = px[base + k]! + l * c;
        py[base + k + 1] = py[base + k]! + l * s;
      }
      for (const q of samples[i]!) project(q[0], q[1], base, row++);
      for (const q of keepOut[i]!) project(q[0], q[1], base, row++);
      row += 2;
    }
  };

  const residuals = (x: Float64Array, r: Float64Array): void => {
    poseAt(x);
    let row = 0;
    for (let i = 0; i < stations; i++) {
      const weights = sampleWeights?.[i];
      const count = samples[i]!.length;
      for (let j = 0; j < count; j++, row++) {
        const miss = nearDistance[row]! - e;
        r[row] = (weights?.[j] ?? 1) * (miss + miss * miss * miss * inv2);
      }
      for (let j = 0; j < keepOut[i]!.length; j++, row++) r[row] = wk * Math.min(0, nearDistance[row]! - e);
      const endPin = pin(x, layout.end, endKind, i);
      r[row++] = w * (px[i * (n + 1) + n]! - endPin[0]);
      r[row++] = w * (py[i * (n + 1) + n]! - endPin[1]);
    }
    r[row++] = wa * (x[layout.start]! - startAnchor[0]);
    r[row++] = wa * (x[layout.start + 1]! - startAnchor[1]);
    r[row++] = wa * (x[layout.end]! - endAnchor[0]);
    r[row++] = wa * (x[layout.end + 1]! - endAnchor[1]);
    // a telescoping plate's common length is the mean of its station lengths
    for (let t = 0; t < layout.telescoping.length; t++) {
      let mean = 0;
      for (let i = 0; i < stations; i++) mean += x[layout.extensions + t * stations + i]!;
      r[row++] = x[layout.lengths + layout.telescoping[t]!]! - mean / stations;
    }
  };

  // Station i's parameters in the order of the first pivot they move: column, that pivot s (they move P_s … P_N), and
  // the direction d they move it in. The start pin's x, y [, slot angle, travel] move every pivot (s = 0); plate l's
  // angle and length move P_{l+1} on.
  const paramCount = (startKind === 'slot' ? 4 : 2) + 2 * n;
  const paramColumn = new Int32Array(paramCount);
  const paramFirst = new Int32Array(paramCount);
  const paramDx = new Float64Array(paramCount);
  const paramDy = new Float64Array(paramCount);
  // the end pin's parameters at station i: column and the direction they move the pin in
  const endColumn = new Int32Array(4);
  const endDx = new Float64Array(4);
  const endDy = new Float64Array(4);

  /** Sets entry p of the station's parameter list; returns p + 1. */
  const setParameter = (p: number, column: number, first: number, dx: number, dy: number): number => {
    paramColumn[p] = column;
    paramFirst[p] = first;
    paramDx[p] = dx;
    paramDy[p] = dy;
    return p + 1;
  };

  /** Fills the parameter lists of station i; returns how many end-pin parameters there are. */
  const stationParameters = (x: Float64Array, i: number): number => {
    let p = setParameter(0, layout.start, 0, 1, 0);
    p = setParameter(p, layout.start + 1, 0, 0, 1);
    if (startKind === 'slot') {
      const psi = x[layout.start + 2]!;
      const travel = x[layout.start + 3 + i]!;
      p = setParameter(p, layout.start + 2, 0, -travel * Math.sin(psi), travel * Math.cos(psi));
      p = setParameter(p, layout.start + 3 + i, 0, Math.cos(psi), Math.sin(psi));
    }
    for (let l = 0; l < n; l++) {
      const c = cos[i * n + l]!;
      const s = sin[i * n + l]!;
      const length = len[i * n + l]!;
      p = setParameter(p, layout.angles + i * n + l, l + 1, -length * s, length * c);
      const slot = telescopingSlot[l]!;
      p = setParameter(p, slot < 0 ? layout.lengths + l : layout.extensions + slot * stations + i, l + 1, c, s);
    }
    endColumn[0] = layout.end;
    endDx[0] = 1;
    endDy[0] = 0;
    endColumn[1] = layout.end + 1;
    endDx[1] = 0;
    endDy[1] = 1;
    if (endKind === 'pivot') return 2;
    const psi = x[layout.end + 2]!;
    const travel = x[layout.end + 3 + i]!;
    endColumn[2] = layout.end + 2;
    endDx[2] = -travel * Math.sin(psi);
    endDy[2] = travel * Math.cos(psi);
    endColumn[3] = layout.end + 3 + i;
    endDx[3] = Math.cos(psi);
    endDy[3] = Math.sin(psi);
    return 4;
  };

  // Per nearest plate k of a station, sums over its rows: h·hᵀ and g·gᵀ (xx, xy, yy), h·gᵀ (xx, xy, yx, yy), r·h and
  // r·g (x, y); after the suffix sums, hh and rh hold them over plates k … N − 1
  const hh = new Float64Array(3 * n);
  const gg = new Float64Array(3 * n);
  const hg = new Float64Array(4 * n);
  const rh = new Float64Array(2 * n);
  const rg = new Float64Array(2 * n);
  // T(s', s)·d_q for each parameter q (first pivot s) and any parameter first moving an earlier pivot s' < s ("before")
  // or the same one ("same"); T(s', s) = Σ over rows of G(s')·G(s)ᵀ
  const before = new Float64Array(2 * paramCount);
  const same = new Float64Array(2 * paramCount);

  /** Index of entry (p, q) of the symmetric JᵀJ, which is kept as its lower triangle (row-major). */
  const lowerIndex = (p: number, q: number): number => (p > q ? p * columnCount + q : q * columnCount + p);

  // the pulls of the row being differentiated: g on P_{k+1} (x, y), then h on P_0 … P_k (x, y)
  const pull = new Float64Array(4);

  /**
   * The pulls of station i's sample or keep-out row `row` (its j-th point, samples first) into `pull`: the residual's
   * derivative with respect to the pivots; false when the row is empty (a zero weight, a keep-out point in the clear).
   */
  const rowPull = (i: number, j: number, row: number): boolean => {
    const stationSamples = samples[i]!;
    const sample = j < stationSamples.length;
    const q = sample ? stationSamples[j]! : keepOut[i]![j - stationSamples.length]!;
    const distance = nearDistance[row]!;
    const miss = distance - e;
    // the residual's own derivative with respect to the distance (the keep-out residual w·min(0, dist − e) is
    // one-sided)
    const lift = sample ? (sampleWeights?.[i]?.[j] ?? 1) * (1 + 3 * miss * miss * inv2) : miss < 0 ? wk : 0;
    if (distance < 1e-12 || lift === 0) return false;
    const base = i * (n + 1);
    const k = nearPlate[row]!;
    const t = nearT[row]!;
    // d(dist)/dP_k = −(1 − t)·u, d(dist)/dP_{k+1} = −t·u (u: unit from the nearest point to q)
    const cx = px[base + k]! + t * (px[base + k + 1]! - px[base + k]!);
    const cy = py[base + k]! + t * (py[base + k + 1]! - py[base + k]!);
    const ux = ((q[0] - cx) / distance) * lift;
    const uy = ((q[1] - cy) / distance) * lift;
    pull[0] = -t * ux;
    pull[1] = -t * uy;
    pull[2] = -(1 - t) * ux + pull[0];
    pull[3] = -(1 - t) * uy + pull[1];
    return true;
  };

  /**
   * Adds station i's rows (samples and keep-out points from `row`, then the two closure rows) to JᵀJ and g; returns
   * the row after them.
   */
  const addStation = (x: Float64Array, r: Float64Array, i: number, row: number, a: Float64Array, g: Float64Array) => {
    hh.fill(0);
    gg.fill(0);
    hg.fill(0);
    rh.fill(0);
    rg.fill(0);
    const rowCount = samples[i]!.length + keepOut[i]!.length;
    for (let j = 0; j < rowCount; j++, row++) {
      if (!rowPull(i, j, row)) continue;
      const k = nearPlate[row]!;
      const gx = pull[0]!;
      const gy = pull[1]!;
      const hx = pull[2]!;
      const hy = pull[3]!;
      const ri = r[row]!;
      // (written out: a call would box its floating-point arguments, for every row)
      hh[3 * k] = hh[3 * k]! + hx * hx;
      hh[3 * k + 1] = hh[3 * k + 1]! + hx * hy;
      hh[3 * k + 2] = hh[3 * k + 2]! + hy * hy;
      gg[3 * k] = gg[3 * k]! + gx * gx;
      gg[3 * k + 1] = gg[3 * k + 1]! + gx * gy;
      gg[3 * k + 2] = gg[3 * k + 2]! + gy * gy;
      hg[4 * k] = hg[4 * k]! + hx * gx;
      hg[4 * k + 1] = hg[4 * k + 1]! + hx * gy;
      hg[4 * k + 2] = hg[4 * k + 2]! + hy * gx;
      hg[4 * k + 3] = hg[4 * k + 3]! + hy * gy;
      rh[2 * k] = rh[2 * k]! + ri * hx;
      rh[2 * k + 1] = rh[2 * k + 1]! + ri * hy;
      rg[2 * k] = rg[2 * k]! + ri * gx;
      rg[2 * k + 1] = rg[2 * k + 1]! + ri * gy;
    }
    // closure rows w·(P_N − end pin): a pull w along x, then along y, on P_N alone, i.e. rows on the last plate with
    // t = 1 and h = g
    const closure = row;
    const last = n - 1;
    for (let axis = 0; axis < 2; axis++, row++) {
      hh[3 * last + 2 * axis] = hh[3 * last + 2 * axis]! + w * w;
      gg[3 * last + 2 * axis] = gg[3 * last + 2 * axis]! + w * w;
      hg[4 * last + 3 * axis] = hg[4 * last + 3 * axis]! + w * w;
      rh[2 * last + axis] = rh[2 * last + axis]! + r[row]! * w;
      rg[2 * last + axis] = rg[2 * last + axis]! + r[row]! * w;
    }
    for (let k = n - 2; k >= 0; k--) {
      for (let c = 0; c < 3; c++) hh[3 * k + c] = hh[3 * k + c]! + hh[3 * (k + 1) + c]!;
      for (let c = 0; c < 2; c++) rh[2 * k + c] = rh[2 * k + c]! + rh[2 * (k + 1) + c]!;
    }

    const endCount = stationParameters(x, i);
    for (let q = 0; q < paramCount; q++) {
      const s = paramFirst[q]!;
      const dx = paramDx[q]!;
      const dy = paramDy[q]!;
      // rows whose nearest plate is s or later pull P_s by h (both parameters see h); rows on plate s − 1 pull it by
      // g (a parameter moving an earlier pivot sees h there, one moving P_s too sees g)
      let bx = 0;
      let by = 0;
      let rx = 0;
      let ry = 0;
      if (s < n) {
        bx = hh[3 * s]! * dx + hh[3 * s + 1]! * dy;
        by = hh[3 * s + 1]! * dx + hh[3 * s + 2]! * dy;
        rx = rh[2 * s]!;
        ry = rh[2 * s + 1]!;
      }
      let sx = bx;
      let sy = by;
      if (s > 0) {
        const k = s - 1;
        bx += hg[4 * k]! * dx + hg[4 * k + 1]! * dy;
        by += hg[4 * k + 2]! * dx + hg[4 * k + 3]! * dy;
        sx += gg[3 * k]! * dx + gg[3 * k + 1]! * dy;
        sy += gg[3 * k + 1]! * dx + gg[3 * k + 2]! * dy;
        rx += rg[2 * k]!;
        ry += rg[2 * k + 1]!;
      }
      before[2 * q] = bx;
      before[2 * q + 1] = by;
      same[2 * q] = sx;
      same[2 * q + 1] = sy;
      const cq = paramColumn[q]!;
      g[cq] = g[cq]! + dx * rx + dy * ry;
    }
    for (let q = 0; q < paramCount; q++) {
      const s = paramFirst[q]!;
      const cq = paramColumn[q]!;
      for (let p = 0; p <= q; p++) {
        const v = paramFirst[p]! < s ? before : same;
        const at = lowerIndex(paramColumn[p]!, cq);
        a[at] = a[at]! + paramDx[p]! * v[2 * q]! + paramDy[p]! * v[2 * q + 1]!;
      }
    }
    // the end pin enters the closure rows only, as −w·(its motion): against itself, against every parameter of the
    // station (each moves P_N by its d), and in g
    for (let p = 0; p < endCount; p++) {
      const cp = endColumn[p]!;
      const ex = endDx[p]!;
      const ey = endDy[p]!;
      g[cp] = g[cp]! - w * (r[closure]! * ex + r[closure + 1]! * ey);
      for (let q = 0; q <= p; q++) {
        const at = lowerIndex(cp, endColumn[q]!);
        a[at] = a[at]! + w * w * (ex * endDx[q]! + ey * endDy[q]!);
      }
      for (let q = 0; q < paramCount; q++) {
        const at = lowerIndex(cp, paramColumn[q]!);
        a[at] = a[at]! - w * w * (ex * paramDx[q]! + ey * paramDy[q]!);
      }
    }
    return row;
  };

  // Rows built one at a time, sparse: `values[0 … count)` in ascending `columns`
  const columns = new Int32Array(columnCount);
  const values = new Float64Array(columnCount);

  /** Appends d(pin)/d(params)·f for an end's pin at station i to the row being built; returns the new count. */
  const pushPin = (x: Float64Array, offset: number, kind: EndKind, i: number, fx: number, fy: number, at: number) => {
    columns[at] = offset;
    values[at++] = fx;
    columns[at] = offset + 1;
    values[at++] = fy;
    if (kind === 'slot') {
      const psi = x[offset + 2]!;
      const t = x[offset + 3 + i]!;
      const c = Math.cos(psi);
      const s = Math.sin(psi);
      columns[at] = offset + 2;
      values[at++] = t * (-s * fx + c * fy);
      columns[at] = offset + 3 + i;
      values[at++] = c * fx + s * fy;
    }
    return at;
  };

  /**
   * Builds the Jacobian row of a pull (gx, gy) on pivot P_{k+1} of station i and (hx, hy) on every pivot up to P_k,
   * plus `end` times that pull on the end pin (−1 in a closure row), into `columns`, `values`; returns its count.
   */
  const buildRow = (
    x: Float64Array,
    i: number,
    k: number,
    gx: number,
    gy: number,
    hx: number,
    hy: number,
    end: number,
  ) => {
    const plates = i * n;
    let at = 0;
    for (let j = 0; j <= k; j++) {
      const fx = j < k ? hx : gx;
      const fy = j < k ? hy : gy;
      columns[at] = layout.angles + plates + j;
      values[at++] = len[plates + j]! * (-sin[plates + j]! * fx + cos[plates + j]! * fy);
    }
    for (let j = 0; j <= k; j++) {
      if (telescopingSlot[j]! >= 0) continue;
      const fx = j < k ? hx : gx;
      const fy = j < k ? hy : gy;
      columns[at] = layout.lengths + j;
      values[at++] = cos[plates + j]! * fx + sin[plates + j]! * fy;
    }
    at = pushPin(x, layout.start, startKind, i, hx, hy, at);
    if (end !== 0) at = pushPin(x, layout.end, endKind, i, end * gx, end * gy, at);
    for (let t = 0; t < layout.telescoping.length; t++) {
      const j = layout.telescoping[t]!;
      if (j > k) continue;
      const fx = j < k ? hx : gx;
      const fy = j < k ? hy : gy;
      columns[at] = layout.extensions + t * stations + i;
      values[at++] = cos[plates + j]! * fx + sin[plates + j]! * fy;
    }
    return at;
  };

  /** The anchor and telescoping rows, which follow every station's, from `row` to `emit(row, count)`. */
  const tailRows = (row: number, emit: (row: number, count: number) => void): void => {
    for (const c of [layout.start, layout.start + 1, layout.end, layout.end + 1]) {
      columns[0] = c;
      values[0] = wa;
      emit(row++, 1);
    }
    for (let t = 0; t < layout.telescoping.length; t++) {
      columns[0] = layout.lengths + layout.telescoping[t]!;
      values[0] = 1;
      for (let i = 0; i < stations; i++) {
        columns[1 + i] = layout.extensions + t * stations + i;
        values[1 + i] = -1 / stations;
      }
      emit(row++, 1 + stations);
    }
  };

  const normalEquations = (x: Float64Array, r: Float64Array, a: Float64Array, g: Float64Array): void => {
    poseAt(x);
    let row = 0;
    for (let i = 0; i < stations; i++) row = addStation(x, r, i, row, a, g);
    tailRows(row, (tail, count) => {
      const ri = r[tail]!;
      for (let p = 0; p < count; p++) {
        const cp = columns[p]!;
        const vp = values[p]!;
        g[cp] = g[cp]! + vp * ri;
        for (let q = 0; q <= p; q++) {
          const at = lowerIndex(cp, columns[q]!);
          a[at] = a[at]! + vp * values[q]!;
        }
      }
    });
  };

  const jacobian = (x: Float64Array, jac: Float64Array): void => {
    poseAt(x);
    jac.fill(0);
    const setRow = (row: number, count: number) => {
      for (let p = 0; p < count; p++) jac[row * columnCount + columns[p]!] = values[p]!;
    };
    let row = 0;
    for (let i = 0; i < stations; i++) {
      const rowCount = samples[i]!.length + keepOut[i]!.length;
      for (let j = 0; j < rowCount; j++, row++) {
        if (rowPull(i, j, row)) setRow(row, buildRow(x, i, nearPlate[row]!, pull[0]!, pull[1]!, pull[2]!, pull[3]!, 0));
      }
      setRow(row++, buildRow(x, i, n - 1, w, 0, w, 0, -1));
      setRow(row++, buildRow(x, i, n - 1, 0, w, 0, w, -1));
    }
    tailRows(row, setRow);
  };

  return { layout, residuals, jacobian, normalEquations };
}

/** Reads the fitted chain out of a parameter vector. */
export function chainFromParameters(x: Float64Array, spec: ChainProblemSpec): PlateChain {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const px = new Float64Array(n + 1);
  const py = new Float64Array(n + 1);
  const pivots: Point[][] = [];
  for (let i = 0; i < layout.stationCount; i++) {
    stationPivots(x, layout, spec, i, px, py);
    const row: Point[] = [];
    for (let k = 0; k <= n; k++) row.push([px[k]!, py[k]!]);
    pivots.push(row);
  }
  const readEnd = (offset: number, kind: EndKind): ChainEnd => {
    if (kind === 'pivot') return { kind: 'pivot', point: [x[offset]!, x[offset + 1]!] };
    const psi = x[offset + 2]!;
    const travel: number[] = [];
    for (let i = 0; i < layout.stationCount; i++) travel.push(x[offset + 3 + i]!);
    return {
      kind: 'slot',
      origin: [x[offset]!, x[offset + 1]!],
      direction: [Math.cos(psi), Math.sin(psi)],
      travelMm: travel,
    };
  };
  // the end pin closes the chain only up to the closure residual: report the pivots as solved, the end from its own
  // parameters (the fit report shows the closure gap)
  return {
    lengthsMm: Array.from(x.subarray(layout.lengths, layout.lengths + n)),
    start: readEnd(layout.start, spec.startKind),
    end: readEnd(layout.end, spec.endKind),
    pivots,
    telescoping: layout.telescoping.map((plate) => ({
      plate,
      stationLengthsMm: Array.from({ length: layout.stationCount }, (_, i) => plateLength(x, layout, plate, i)),
    })),
  };
}
