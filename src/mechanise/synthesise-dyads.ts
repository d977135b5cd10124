import type { Point } from '../geometry/index.js';
import {
  burmesterPoints5,
  centrePointCurve4,
  centrePointFor3,
  type Dyad,
  kasaCircleFit,
  measureDyad,
  multistartDyads,
  placePoint,
  type RelativePose,
} from '../synthesis/index.js';
import type { LinkSynthesis } from './link-design.js';
import type { PlatePinRegion } from './plate-pin-region.js';

/** A dyad for the distinct positions with the method that found it. */
export interface SynthesisedDyad extends Dyad {
  readonly synthesis: LinkSynthesis;
}

/** Dyads for one pair of bodies and what could not be synthesised. */
export interface DyadSynthesis {
  readonly dyads: readonly SynthesisedDyad[];
  /** Circle points whose positions lie on a line: no finite centre (a slider would fit, not a pin). */
  readonly collinear: number;
  /** Least-squares fits that did not converge or missed the residual limit. */
  readonly residualTooLarge: number;
  /** Exact or least-squares solutions whose circle point lies outside B's pin region. */
  readonly outsidePinRegion: number;
}

/** Settings of `synthesiseDyads`. */
export interface DyadSynthesisSettings {
  /** Candidate circle points in B's frame (the plate pin grid). */
  readonly circlePoints: readonly Point[];
  /** B's pin region, to filter the circle points the curve methods return. */
  readonly pinRegion: PlatePinRegion;
  readonly linkLengthMinMm: number;
  readonly linkLengthMaxMm: number;
  /** Largest `dyadResidual` accepted from a least-squares fit, mm. */
  readonly residualLimitMm: number;
}

/**
 * Binary links between body A and plate B for the distinct positions of B relative to A (Burmester theory; Erdman,
 * Sandor & Kota, *Mechanism Design*; Sandor & Erdman, *Advanced Mechanism Design* vol. 2; McCarthy & Soh, *Geometric
 * Design of Linkages*, ch. 4), by the number of positions m:
 * - m = 1 (B does not move): any centre; centres on 16 directions round each circle point at three lengths;
 * - m = 2: centres on the perpendicular bisector of the circle point's two positions, 9 along it;
 * - m = 3: the circumcentre of each circle point's three positions (`centrePointFor3`);
 * - m = 4: samples of the centre-point curve whose circle point lies in B's pin region (`centrePointCurve4`);
 * - m = 5: the Burmester point pairs (`burmesterPoints5`);
 * - m ≥ 4: also a circle fit (Kåsa) through each grid circle point's positions, and least-squares dyads started from the circle-point grid (`multistartDyads`), kept when their residual
 *   is within `residualLimitMm` (for m > 5 the only ones): fitted positions carry the fit's error, so a link a little
 *   off every exact solution may serve better than any of them.
 */
export function synthesiseDyads(poses: readonly RelativePose[], settings: DyadSynthesisSettings): DyadSynthesis {
  const m = poses.length;
  const dyads: SynthesisedDyad[] = [];
  let collinear = 0;
  let residualTooLarge = 0;
  let outsidePinRegion = 0;
  const { circlePoints, pinRegion } = settings;
  if (circlePoints.length === 0) return { dyads, collinear, residualTooLarge, outsidePinRegion };
  if (m <= 2) {
    const lengths = [0.25, 0.5, 1].map(
      (f) => settings.linkLengthMinMm + f * 0.5 * (settings.linkLengthMaxMm - settings.linkLengthMinMm),
    );
    for (const c of circlePoints) {
      const p0 = placePoint(poses[0]!, c);
      const centres: Point[] = [];
      if (m === 1) {
        for (let k = 0; k < 16; k++) {
          const a = (2 * Math.PI * k) / 16;
          for (const r of lengths) centres.push([p0[0] + r * Math.cos(a), p0[1] + r * Math.sin(a)]);
        }
      } else {
        const p1 = placePoint(poses[1]!, c);
        const mid: Point = [0.5 * (p0[0] + p1[0]), 0.5 * (p0[1] + p1[1])];
        const d = Math.hypot(p1[0] - p0[0], p1[1] - p0[1]);
        if (!(d > 0)) {
          collinear++;
          continue;
        }
        const n: Point = [-(p1[1] - p0[1]) / d, (p1[0] - p0[0]) / d];
        for (let k = -4; k <= 4; k++) {
          if (k === 0) continue;
          const t = (k / 4) * settings.linkLengthMaxMm;
          centres.push([mid[0] + t * n[0], mid[1] + t * n[1]]);
        }
      }
      for (const centre of centres) dyads.push({ ...measureDyad(poses, centre, c), synthesis: 'any-centre' });
    }
  } else if (m === 3) {
    for (const c of circlePoints) {
      const r = centrePointFor3(poses, c);
      if (r.status !== 'ok') {
        collinear++;
        continue;
      }
      dyads.push({ ...measureDyad(poses, r.centre, c), synthesis: 'circumcentre' });
    }
  } else if (m === 4) {
    const curve = centrePointCurve4(poses, { extentMm: 2 * settings.linkLengthMaxMm + 100 });
    for (const s of curve.samples) {
      if (pinRegion.contains(s.circlePointLocal)) dyads.push({ ...dyadOf(s), synthesis: 'centre-point-curve' });
      else outsidePinRegion++;
    }
  } else if (m === 5) {
    const b = burmesterPoints5(poses);
    for (const pair of b.pairs) {
      if (pinRegion.contains(pair.circlePointLocal)) dyads.push({ ...dyadOf(pair), synthesis: 'burmester-point' });
      else outsidePinRegion++;
    }
  }
  if (m >= 4) {
    // circle fits through each grid point's positions (Kåsa, then measured as a dyad): links that are rigid to within
    // the residual limit rather than exactly, for any number of positions; robust where the exact solutions are
    // sensitive to small errors in the positions (short strokes)
    for (const c of circlePoints) {
      const circle = kasaCircleFit(poses.map((pose) => placePoint(pose, c)));
      if (circle.status !== 'ok') {
        collinear++;
        continue;
      }
      const dyad = measureDyad(poses, circle.centre, c);
      if (dyad.residualMm <= settings.residualLimitMm) dyads.push({ ...dyad, synthesis: 'circle-fit' });
      else residualTooLarge++;
    }
    // the positions come from a fitted chain and carry its error: exact dyads for them are not the only good links,
    // and for more than five positions there are none. Least-squares dyads from the circle-point grid join the pool
    // whenever their residual is within the limit; the mechanism built from them is checked station by station.
    let minX = Number.POSITIVE_INFINITY;
    let minY = Number.POSITIVE_INFINITY;
    let maxX = Number.NEGATIVE_INFINITY;
    let maxY = Number.NEGATIVE_INFINITY;
    for (const [x, y] of circlePoints) {
      minX = Math.min(minX, x);
      minY = Math.min(minY, y);
      maxX = Math.max(maxX, x);
      maxY = Math.max(maxY, y);
    }
    const fits = multistartDyads(poses, {
      circlePointMin: [minX, minY],
      circlePointMax: [maxX, maxY],
      steps: Math.max(2, Math.round(Math.sqrt(circlePoints.length))),
      keep: 16,
      fit: { maxRadiusMm: 4 * settings.linkLengthMaxMm },
    });
    for (const fit of fits.candidates) {
      const dyad = measureDyad(poses, fit.centre, fit.circlePointLocal);
      if (dyad.residualMm <= settings.residualLimitMm && pinRegion.contains(fit.circlePointLocal)) {
        // an exact dyad for four or five positions lies on the centre-point curve or is a Burmester pair, however
        // it was found
        const exact = dyad.residualMm <= EXACT_DYAD_MM;
        const synthesis =
          exact && m === 4 ? 'centre-point-curve' : exact && m === 5 ? 'burmester-point' : 'least-squares';
        dyads.push({ ...dyad, synthesis });
      } else if (!pinRegion.contains(fit.circlePointLocal)) outsidePinRegion++;
      else if (m > 5) residualTooLarge++;
    }
    if (m > 5) residualTooLarge += fits.failed;
  }
  return { dyads, collinear, residualTooLarge, outsidePinRegion };
}

/** A dyad whose pin distance varies less than this over the positions is exact, mm. */
const EXACT_DYAD_MM = 1e-8;

function dyadOf(d: Dyad): Dyad {
  return { centre: d.centre, circlePointLocal: d.circlePointLocal, radiusMm: d.radiusMm, residualMm: d.residualMm };
}
