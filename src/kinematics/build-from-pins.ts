import type { Point } from '../geometry/index.js';
import { defineMechanism } from './define-mechanism.js';
import type { BodyKind, BodySpec, DriverSpec, Joint, Mechanism } from './mechanism.js';

/** A body of `buildFromPins`: the pins it carries, by name. */
export interface PinnedBodySpec {
  readonly id: string;
  readonly kind: BodyKind;
  /** @default 0 */
  readonly layer?: number;
  /** Names of the pins (keys of `PinnedMechanismSpec.pins`) this body carries; the first two fix its frame. */
  readonly pins: readonly string[];
  /** Extra named points, given in the die-body frame at the assembled configuration, mm. */
  readonly points?: Readonly<Record<string, Point>>;
}

/** A slide of `buildFromPins`: body J slides on body I along `direction` through `point` (die-body frame). */
export interface PinnedSlideSpec {
  readonly id: string;
  readonly bodyI: string;
  readonly bodyJ: string;
  readonly point: Point;
  readonly direction: Point;
}

/** A mechanism described by where its pins are in one assembled configuration. */
export interface PinnedMechanismSpec {
  /** Pin centres in the die-body frame at the assembled configuration, mm. */
  readonly pins: Readonly<Record<string, Point>>;
  /** Bodies; exactly one of kind `'die_body'`. */
  readonly bodies: readonly PinnedBodySpec[];
  readonly slides?: readonly PinnedSlideSpec[];
  readonly drivers?: readonly DriverSpec[];
}

/**
 * Builds a mechanism from pin positions in one assembled configuration, so it is assembled by construction and
 * every length follows from the drawing. Each moving body's frame has its origin at its first pin and its x axis
 * towards its second pin (φ = 0 if it has one pin); the die body's frame is the die-body frame. A pin carried by
 * bodies b1, b2, … bk gives revolute joints named after the pin between b1 and b2, then `pin#2` between b1 and b3, and
 * so on; a pin carried by one body is just a named point. Every pin becomes a named point of each body carrying it.
 * The bodies' `initial` poses are the drawn configuration. Throws for unknown pins or an invalid mechanism.
 */
export function buildFromPins(spec: PinnedMechanismSpec): Mechanism {
  const frames = new Map<string, { x: number; y: number; phi: number }>();
  const bodies: BodySpec[] = spec.bodies.map((b) => {
    const at = (name: string): Point => {
      const p = spec.pins[name];
      if (!p) throw new Error(`buildFromPins: body '${b.id}' carries unknown pin '${name}'`);
      return p;
    };
    let frame = { x: 0, y: 0, phi: 0 };
    if (b.kind !== 'die_body' && b.pins.length > 0) {
      const o = at(b.pins[0]!);
      const second = b.pins[1] === undefined ? undefined : at(b.pins[1]);
      const phi =
        second && Math.hypot(second[0] - o[0], second[1] - o[1]) > 0
          ? Math.atan2(second[1] - o[1], second[0] - o[0])
          : 0;
      frame = { x: o[0], y: o[1], phi };
    }
    frames.set(b.id, frame);
    const points: Record<string, Point> = {};
    for (const name of b.pins) points[name] = toLocal(frame, at(name));
    for (const [name, p] of Object.entries(b.points ?? {})) points[name] = toLocal(frame, p);
    return { id: b.id, kind: b.kind, layer: b.layer ?? 0, points, initial: frame };
  });
  const joints: Joint[] = [];
  for (const [name, p] of Object.entries(spec.pins)) {
    const carriers = spec.bodies.filter((b) => b.pins.includes(name));
    const first = carriers[0];
    if (!first) continue;
    carriers.slice(1).forEach((other, m) => {
      joints.push({
        kind: 'revolute',
        id: m === 0 ? name : `${name}#${m + 1}`,
        bodyI: first.id,
        pointI: toLocal(frames.get(first.id)!, p),
        bodyJ: other.id,
        pointJ: toLocal(frames.get(other.id)!, p),
      });
    });
  }
  for (const s of spec.slides ?? []) {
    const fi = frames.get(s.bodyI);
    const fj = frames.get(s.bodyJ);
    if (!fi || !fj) throw new Error(`buildFromPins: slide '${s.id}' refers to an unknown body`);
    joints.push({
      kind: 'prismatic',
      id: s.id,
      bodyI: s.bodyI,
      pointI: toLocal(fi, s.point),
      axisI: rotate(s.direction, -fi.phi),
      bodyJ: s.bodyJ,
      pointJ: toLocal(fj, s.point),
      axisJ: rotate(s.direction, -fj.phi),
    });
  }
  return defineMechanism({ bodies, joints, drivers: spec.drivers ?? [] });
}

function toLocal(frame: { x: number; y: number; phi: number }, p: Point): Point {
  return rotate([p[0] - frame.x, p[1] - frame.y], -frame.phi);
}

function rotate(v: Point, angle: number): Point {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  return [c * v[0] - s * v[1], s * v[0] + c * v[1]];
}
