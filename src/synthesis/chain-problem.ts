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
 * DOMAIN.md §2); W·(P_N − end pin) per station (closure); weak ties of each end's position to its start value (they
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

/** Writes d(pin)/d(params) · g into row (adds `sign`·g·∂pin). */
function addPinGradient(
  row: Float64Array,
  rowOffset: number,
  x: Float64Array,
  offset: number,
  kind: EndKind,
  station: number,
  gx: number,
  gy: number,
): void {
  row[rowOffset + offset] = row[rowOffset + offset]! + gx;
  row[rowOffset + offset + 1] = row[rowOffset + offset + 1]! + gy;
  if (kind === 'slot') {
    const psi = x[offset + 2]!;
    const t = x[offset + 3 + station]!;
    const c = Math.cos(psi);
    const s = Math.sin(psi);
    row[rowOffset + offset + 2] = row[rowOffset + offset + 2]! + t * (-s * gx + c * gy);
    row[rowOffset + offset + 3 + station] = row[rowOffset + offset + 3 + station]! + c * gx + s * gy;
  }
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

/** Builds residual and Jacobian callbacks for the least-squares solver. */
export function makeChainProblem(spec: ChainProblemSpec) {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const e = spec.edgeOffsetMm;
  const w = spec.closureWeight ?? 30;
  const wa = spec.anchorWeight ?? 1e-4;
  const tau = spec.emphasisMm ?? 0;
  const wk = spec.keepOutWeight ?? 3;
  const keepOut = spec.keepOut ?? spec.samples.map(() => []);
  const inv2 = tau > 0 ? 1 / (tau * tau) : 0;
  const px = new Float64Array(n + 1);
  const py = new Float64Array(n + 1);

  /** Nearest segment of the current station's pivot polyline to q. */
  const nearest = (qx: number, qy: number) => {
    let best = Number.POSITIVE_INFINITY;
    let seg = 0;
    let bt = 0;
    for (let k = 0; k < n; k++) {
      const ax = px[k]!;
      const ay = py[k]!;
      const dx = px[k + 1]! - ax;
      const dy = py[k + 1]! - ay;
      const l2 = dx * dx + dy * dy;
      let t = l2 > 0 ? ((qx - ax) * dx + (qy - ay) * dy) / l2 : 0;
      t = t < 0 ? 0 : Math.min(t, 1);
      const ex = ax + t * dx - qx;
      const ey = ay + t * dy - qy;
      const d2 = ex * ex + ey * ey;
      if (d2 < best) {
        best = d2;
        seg = k;
        bt = t;
      }
    }
    return { distance: Math.sqrt(best), segment: seg, t: bt };
  };

  const residuals = (x: Float64Array, r: Float64Array): void => {
    let row = 0;
    for (let i = 0; i < layout.stationCount; i++) {
      stationPivots(x, layout, spec, i, px, py);
      const weights = spec.sampleWeights?.[i];
      spec.samples[i]!.forEach((q, j) => {
        const miss = nearest(q[0], q[1]).distance - e;
        r[row++] = (weights?.[j] ?? 1) * (miss + miss * miss * miss * inv2);
      });
      for (const q of keepOut[i]!) r[row++] = wk * Math.min(0, nearest(q[0], q[1]).distance - e);
      const endPin = pin(x, layout.end, spec.endKind, i);
      r[row++] = w * (px[n]! - endPin[0]);
      r[row++] = w * (py[n]! - endPin[1]);
    }
    r[row++] = wa * (x[layout.start]! - spec.startAnchor[0]);
    r[row++] = wa * (x[layout.start + 1]! - spec.startAnchor[1]);
    r[row++] = wa * (x[layout.end]! - spec.endAnchor[0]);
    r[row++] = wa * (x[layout.end + 1]! - spec.endAnchor[1]);
    // a telescoping plate's common length is the mean of its station lengths
    for (let t = 0; t < layout.telescoping.length; t++) {
      let mean = 0;
      for (let i = 0; i < layout.stationCount; i++) mean += x[layout.extensions + t * layout.stationCount + i]!;
      r[row++] = x[layout.lengths + layout.telescoping[t]!]! - mean / layout.stationCount;
    }
  };

  const jacobian = (x: Float64Array, jac: Float64Array): void => {
    jac.fill(0);
    const cols = layout.parameterCount;
    let row = 0;
    for (let i = 0; i < layout.stationCount; i++) {
      stationPivots(x, layout, spec, i, px, py);
      const angleBase = layout.angles + i * n;
      // d(dist)/dP_k = −(1 − t)·n, d(dist)/dP_{k+1} = −t·n (n: unit from the nearest point to q); P_k depends on the
      // start pin and plates 0..k−1; `scale` carries the residual's own derivative with respect to the distance
      const writeRow = (q: Point, scale: number) => {
        const { distance, segment: k, t } = nearest(q[0], q[1]);
        const ro = row * cols;
        row++;
        const miss = distance - e;
        const lift = scale < 0 ? (miss < 0 ? -scale : 0) : scale * (1 + 3 * miss * miss * inv2);
        // a zero weight leaves the row empty (its residual is zero too)
        if (distance < 1e-12 || lift === 0) return;
        const cx = px[k]! + t * (px[k + 1]! - px[k]!);
        const cy = py[k]! + t * (py[k + 1]! - py[k]!);
        const nx = ((q[0] - cx) / distance) * lift;
        const ny = ((q[1] - cy) / distance) * lift;
        const gax = -(1 - t) * nx;
        const gay = -(1 - t) * ny;
        const gbx = -t * nx;
        const gby = -t * ny;
        addPinGradient(jac, ro, x, layout.start, spec.startKind, i, gax + gbx, gay + gby);
        for (let j = 0; j <= k; j++) {
          const gx = j < k ? gax + gbx : gbx;
          const gy = j < k ? gay + gby : gby;
          const len = plateLength(x, layout, j, i);
          const th = x[angleBase + j]!;
          const c = Math.cos(th);
          const s = Math.sin(th);
          const ext = extensionIndex(layout, j, i);
          jac[ro + (ext >= 0 ? ext : layout.lengths + j)] = c * gx + s * gy;
          jac[ro + angleBase + j] = len * (-s * gx + c * gy);
        }
      };
      const weights = spec.sampleWeights?.[i];
      spec.samples[i]!.forEach((q, j) => {
        writeRow(q, weights?.[j] ?? 1);
      });
      // keep-out rows: negative scale marks the one-sided residual w·min(0, dist − e)
      for (const q of keepOut[i]!) writeRow(q, -wk);
      for (let axis = 0; axis < 2; axis++) {
        const ro = row * cols;
        row++;
        const gx = axis === 0 ? w : 0;
        const gy = axis === 1 ? w : 0;
        addPinGradient(jac, ro, x, layout.start, spec.startKind, i, gx, gy);
        addPinGradient(jac, ro, x, layout.end, spec.endKind, i, -gx, -gy);
        for (let j = 0; j < n; j++) {
          const len = plateLength(x, layout, j, i);
          const th = x[angleBase + j]!;
          const c = Math.cos(th);
          const s = Math.sin(th);
          const ext = extensionIndex(layout, j, i);
          jac[ro + (ext >= 0 ? ext : layout.lengths + j)] = c * gx + s * gy;
          jac[ro + angleBase + j] = len * (-s * gx + c * gy);
        }
      }
    }
    jac[row++ * cols + layout.start] = wa;
    jac[row++ * cols + layout.start + 1] = wa;
    jac[row++ * cols + layout.end] = wa;
    jac[row++ * cols + layout.end + 1] = wa;
    for (let t = 0; t < layout.telescoping.length; t++) {
      const ro = row++ * cols;
      jac[ro + layout.lengths + layout.telescoping[t]!] = 1;
      for (let i = 0; i < layout.stationCount; i++) {
        jac[ro + layout.extensions + t * layout.stationCount + i] = -1 / layout.stationCount;
      }
    }
  };

  return { layout, residuals, jacobian };
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
