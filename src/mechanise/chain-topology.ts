import type { Point, Region } from '../geometry/index.js';
import type { BodyPose, Joint } from '../kinematics/index.js';
import { wrapAngle } from '../numeric/index.js';
import { type ChainEnd, type ChainFit, endPoint } from '../synthesis/index.js';

/**
 * What mechanisation needs of a chain fit (a `ChainFit` is one): the fitted chain, the plate shape, the die opening
 * and each station's target orifice, in schedule order.
 */
export interface MechanisableChain {
  readonly chain: ChainFit['chain'];
  readonly shape: ChainFit['shape'];
  readonly opening: Region;
  readonly stations: readonly { readonly targetOrifice: Region }[];
  /** Each plate's shaped melt edge in its own frame, or null for a straight edge; absent: all straight. */
  readonly edgeProfiles?: ChainFit['edgeProfiles'];
}

/** A moving body of the chain: a plate, the sliding half of a telescoping pair, or the slider block of a slotted end. */
export interface ChainBody {
  readonly id: string;
  readonly kind: 'plate' | 'link';
  /** `plate`: plate k (frame at pivot k−1); `slide`: its telescoping half (frame at pivot k); `slider`: slot block. */
  readonly role: 'plate' | 'slide' | 'slider';
  /** 1-based plate number k for plates and slides; 0 for a slider. */
  readonly plate: number;
  readonly layer: number;
  /**
   * Range of the body's x axis (its own frame, mm) whose plate body may carry a link pin: [0, L] for a rigid plate;
   * the half of the shortest length next to its pivot for either half of a telescoping pair (the slide reaches back,
   * toward −x); empty ([0, 0]) for a slider block.
   */
  readonly pinSpanMm: readonly [from: number, to: number];
  /** The chain pivots this body carries, in its own frame, mm. */
  readonly pivotsLocal: readonly Point[];
}

/**
 * The chain as a loop: moving bodies B₁ … B_M in chain order and joints J₀ … J_M, J₀ between the die body and B₁,
 * Jᵢ between Bᵢ and Bᵢ₊₁, J_M between B_M and the die body. Ids follow the plan's chain mechanism: `plate_k`,
 * `plate_k_slide`, `slider_start|end`, `pivot_k`, `telescope_k`, `slot_start|end`.
 */
export interface ChainTopology {
  readonly bodies: readonly ChainBody[];
  readonly joints: readonly Joint[];
  /** Grübler mobility of the chain alone: M − 2 (N − 2 for N plates, +1 per slot, +1 per telescoping pair). */
  readonly degreesOfFreedom: number;
  /** Where pivot k (k = 0 … N) is carried: a body and a point in its frame. */
  readonly pivots: readonly { readonly body: string; readonly local: Point }[];
  /** Fitted pose of every chain body at every station (schedule order), die-body frame; angles unwrapped along it. */
  readonly fittedPoses: readonly (readonly BodyPose[])[];
  /** First layer for binary links: above every plate and slider block. */
  readonly linkLayerBase: number;
}

/**
 * Reads the fitted chain as a mechanism loop (docs/MODEL.md §2): each plate's frame has pivot 0 of the plate at its
 * origin and its x axis toward its next pivot; a telescoping pair is two bodies sliding along that axis; a slotted end
 * is a slider block (frame angle 0) on a prismatic joint with the die body. Plates alternate layers 1 and 2 unless
 * `plateLayers` (one per plate, from 1) says otherwise; the slide of a pair takes the other of 1 and 2; slider blocks
 * take the layer above the highest plate, and links start above them (`linkLayerBase`).
 */
export function chainTopology(fit: MechanisableChain, plateLayers: readonly number[] | null = null): ChainTopology {
  const { chain } = fit;
  const n = chain.lengthsMm.length;
  const stations = chain.pivots.length;
  const telescoping = new Map(chain.telescoping.map((t) => [t.plate + 1, t.stationLengthsMm]));
  const bodies: ChainBody[] = [];
  const joints: Joint[] = [];
  const pivots: { body: string; local: Point }[] = [];

  const plateLayer = (k: number) => plateLayers?.[k - 1] ?? (k % 2 === 1 ? 1 : 2);
  const sliderLayer = Math.max(2, ...(plateLayers ?? [])) + 1;
  if (chain.start.kind === 'slot') {
    bodies.push({
      id: 'slider_start',
      kind: 'link',
      role: 'slider',
      plate: 0,
      layer: sliderLayer,
      pinSpanMm: [0, 0],
      pivotsLocal: [[0, 0]],
    });
    joints.push(slotJoint(chain.start, 'start'));
    joints.push(revolute('pivot_0', 'slider_start', [0, 0], 'plate_1', [0, 0]));
  } else {
    joints.push(revolute('pivot_0', 'die_body', chain.start.point, 'plate_1', [0, 0]));
  }
  pivots.push({ body: 'plate_1', local: [0, 0] });
  for (let k = 1; k <= n; k++) {
    const plate = `plate_${k}`;
    const stationLengths = telescoping.get(k);
    const tele = stationLengths !== undefined;
    const half = tele ? Math.min(...stationLengths) / 2 : 0;
    bodies.push({
      id: plate,
      kind: 'plate',
      role: 'plate',
      plate: k,
      layer: plateLayer(k),
      pinSpanMm: tele ? [0, half] : [0, chain.lengthsMm[k - 1]!],
      pivotsLocal: tele
        ? [[0, 0]]
        : [
            [0, 0],
            [chain.lengthsMm[k - 1]!, 0],
          ],
    });
    let outgoing = plate;
    let outPoint: Point = [chain.lengthsMm[k - 1]!, 0];
    if (tele) {
      const slide = `${plate}_slide`;
      bodies.push({
        id: slide,
        kind: 'plate',
        role: 'slide',
        plate: k,
        layer: 3 - plateLayer(k),
        pinSpanMm: [-half, 0],
        pivotsLocal: [[0, 0]],
      });
      joints.push({
        kind: 'prismatic',
        id: `telescope_${k}`,
        bodyI: plate,
        pointI: [0, 0],
        axisI: [1, 0],
        bodyJ: slide,
        pointJ: [0, 0],
        axisJ: [1, 0],
      });
      outgoing = slide;
      outPoint = [0, 0];
    }
    pivots.push({ body: outgoing, local: outPoint });
    if (k < n) joints.push(revolute(`pivot_${k}`, outgoing, outPoint, `plate_${k + 1}`, [0, 0]));
    else if (chain.end.kind === 'slot') {
      bodies.push({
        id: 'slider_end',
        kind: 'link',
        role: 'slider',
        plate: 0,
        layer: sliderLayer,
        pinSpanMm: [0, 0],
        pivotsLocal: [[0, 0]],
      });
      joints.push(revolute(`pivot_${n}`, outgoing, outPoint, 'slider_end', [0, 0]));
      joints.push(slotJoint(chain.end, 'end'));
    } else {
      joints.push(revolute(`pivot_${n}`, outgoing, outPoint, 'die_body', chain.end.point));
    }
  }

  const fittedPoses: BodyPose[][] = [];
  for (let i = 0; i < stations; i++) {
    const p = chain.pivots[i]!;
    const previous = fittedPoses[i - 1];
    const poses = bodies.map((b, m): BodyPose => {
      let origin: Point;
      let phi = 0;
      if (b.role === 'slider') {
        origin = endPoint(b.id === 'slider_start' ? chain.start : chain.end, i);
      } else {
        const a = p[b.plate - 1]!;
        const c = p[b.plate]!;
        origin = b.role === 'plate' ? a : c;
        phi = Math.atan2(c[1] - a[1], c[0] - a[0]);
        // unwrapped along the schedule, so joint values change continuously from station to station
        if (previous) phi = previous[m]!.phi + wrapAngle(phi - previous[m]!.phi);
      }
      return { x: origin[0], y: origin[1], phi };
    });
    fittedPoses.push(poses);
  }
  return { bodies, joints, degreesOfFreedom: bodies.length - 2, pivots, fittedPoses, linkLayerBase: sliderLayer + 1 };
}

function revolute(id: string, bodyI: string, pointI: Point, bodyJ: string, pointJ: Point): Joint {
  return { kind: 'revolute', id, bodyI, pointI, bodyJ, pointJ };
}

function slotJoint(end: Extract<ChainEnd, { kind: 'slot' }>, which: 'start' | 'end'): Joint {
  return {
    kind: 'prismatic',
    id: `slot_${which}`,
    bodyI: 'die_body',
    pointI: end.origin,
    axisI: end.direction,
    bodyJ: `slider_${which}`,
    pointJ: [0, 0],
    axisJ: end.direction,
  };
}
