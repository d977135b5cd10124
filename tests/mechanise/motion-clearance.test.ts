import { describe, expect, it } from 'vitest';
import type { BodyPose } from '../../src/kinematics/index.js';
import {
  type ClearanceParts,
  collisionDefects,
  linkLayerOrder,
  makeClearanceInspector,
  type MotionPlace,
} from '../../src/mechanise/index.js';

/**
 * Hand-built parts with clearances worked out by hand (plane geometry: a point rotated into a rectangle's frame,
 * its distance to the nearest side). A 20 × 10 mm plate turns about the origin; a link's die-body pin sits at
 * (10, 13); pins are 2 mm in radius.
 */
const rectangle = (x0: number, y0: number, x1: number, y1: number): [number, number][] => [
  [x0, y0],
  [x1, y0],
  [x1, y1],
  [x0, y1],
];
const far = rectangle(100, 100, 110, 110);
const at = (position: number | null, leg: [number, number] | null = null, fraction = 0): MotionPlace => ({
  position,
  leg,
  fraction,
});
const deg = (d: number) => (d * Math.PI) / 180;

function groundPinCase(): ClearanceParts {
  return {
    plates: [{ id: 'plate_1', layer: 1, outline: rectangle(0, 0, 20, 10) }],
    links: [{ id: 'link_1', layer: 4, lengthMm: 30, bodyA: 'die_body', bodyB: 'plate_2' }],
    layerOf: new Map([
      ['plate_1', 1],
      ['plate_2', 2],
    ]),
    opening: far,
    pinRadiusMm: 2,
    steelMm: 5,
  };
}

const poses =
  (plateAngle: number, extra: Record<string, BodyPose> = {}) =>
  (id: string): BodyPose =>
    extra[id] ?? (id === 'link_1' ? { x: 10, y: 13, phi: deg(90) } : { x: 0, y: 0, phi: plateAngle });

describe('makeClearanceInspector', () => {
  it('reports the known margin of a die-body pin clear of a plate: 3 mm to the plate less the 2 mm pin', () => {
    // at 0° the pin (10, 13) is 3 mm above the plate's top side y = 10
    const inspector = makeClearanceInspector(groundPinCase());
    inspector.inspect(poses(0), at(0));
    const record = inspector.records().find((r) => r.kind === 'ground-pivot')!;
    expect(record.parts).toEqual(['link_1', 'plate_1']);
    expect(record.clearanceMm).toBeCloseTo(1, 9);
    expect(collisionDefects(inspector.records())).toEqual([]);
  });

  it('finds the plate sweeping over the pin between two stations that are both clear', () => {
    // at 60° the pin in the plate frame is (10·cos60 + 13·sin60, −10·sin60 + 13·cos60) = (16.258, −2.160): 2.160 mm
    // below the plate; at 30° it is (15.160, 6.258), 3.742 mm inside (nearest side y = 10)
    const inspector = makeClearanceInspector(groundPinCase());
    inspector.inspect(poses(0), at(0));
    inspector.inspect(poses(deg(60)), at(1));
    const atStations = inspector.records().find((r) => r.kind === 'ground-pivot')!;
    const below = -(-10 * Math.sin(deg(60)) + 13 * Math.cos(deg(60)));
    expect(atStations.clearanceMm).toBeCloseTo(below - 2, 9);
    expect(collisionDefects(inspector.records())).toEqual([]);
    inspector.inspect(poses(deg(30)), at(null, [0, 1], 0.5));
    const between = inspector.records().find((r) => r.kind === 'ground-pivot')!;
    const inside = 10 - (-10 * Math.sin(deg(30)) + 13 * Math.cos(deg(30)));
    expect(between.clearanceMm).toBeCloseTo(-inside - 2, 9);
    expect(between.at).toEqual(at(null, [0, 1], 0.5));
    const defects = collisionDefects(inspector.records());
    expect(defects).toHaveLength(1);
    expect(defects[0]).toMatchObject({ code: 'COLLISION', leg: [0, 1] });
    expect(defects[0]!.message).toMatch(/link_1 and plate_1 overlap by 5\.74 mm/);
  });

  it('a link pin on a layer-1 plate must clear a layer-2 plate it passes through', () => {
    // the link's pin on plate_1 (its end b, 30 mm along the link from (10, 40) straight down: (10, 10)) lies 1 mm
    // inside plate_2 = [9, 19] × [0, 20] on layer 2, between layer 1 and the link's layer 4
    const parts: ClearanceParts = {
      plates: [
        { id: 'plate_1', layer: 1, outline: rectangle(0, 0, 20, 10) },
        { id: 'plate_2', layer: 2, outline: rectangle(9, 0, 19, 20) },
      ],
      links: [{ id: 'link_1', layer: 4, lengthMm: 30, bodyA: 'die_body', bodyB: 'plate_1' }],
      layerOf: new Map([
        ['plate_1', 1],
        ['plate_2', 2],
      ]),
      opening: far,
      pinRadiusMm: 2,
      steelMm: 5,
    };
    const inspector = makeClearanceInspector(parts);
    inspector.inspect((id) => (id === 'link_1' ? { x: 10, y: 40, phi: deg(-90) } : { x: 0, y: 0, phi: 0 }), at(0));
    const through = inspector.records().find((r) => r.kind === 'pin-through-layer')!;
    expect(through.parts).toEqual(['link_1', 'plate_2']);
    expect(through.clearanceMm).toBeCloseTo(-1 - 2, 9);
  });

  it('two plates on one layer overlapping by 1 mm report −1 mm, and are not a collision defect', () => {
    // plate_3 = [9, 19] × [2, 8] reaches 1 mm into plate_1 = [0, 10] × [0, 10] (its corners at x = 9)
    const parts: ClearanceParts = {
      plates: [
        { id: 'plate_1', layer: 1, outline: rectangle(0, 0, 10, 10) },
        { id: 'plate_3', layer: 1, outline: rectangle(9, 2, 19, 8) },
      ],
      links: [],
      layerOf: new Map(),
      opening: far,
      pinRadiusMm: 2,
      steelMm: 5,
    };
    const inspector = makeClearanceInspector(parts);
    inspector.inspect(() => ({ x: 0, y: 0, phi: 0 }), at(0));
    const same = inspector.records().find((r) => r.kind === 'same-layer')!;
    expect(same.clearanceMm).toBeCloseTo(-1, 9);
    expect(collisionDefects(inspector.records())).toEqual([]);
  });

  it('a link over the opening must stay the steel width inside the plates: 2 mm inside is 3 mm short', () => {
    // opening [0, 40] × [0, 30]; the plate covers y ≥ 10; the link runs from (5, 28) down to (5, 12)
    const parts: ClearanceParts = {
      plates: [{ id: 'plate_1', layer: 1, outline: rectangle(-5, 10, 45, 40) }],
      links: [{ id: 'link_1', layer: 4, lengthMm: 16, bodyA: 'die_body', bodyB: 'plate_1' }],
      layerOf: new Map([['plate_1', 1]]),
      opening: rectangle(0, 0, 40, 30),
      pinRadiusMm: 2,
      steelMm: 5,
    };
    const inspector = makeClearanceInspector(parts);
    inspector.inspect((id) => (id === 'link_1' ? { x: 5, y: 28, phi: deg(-90) } : { x: 0, y: 0, phi: 0 }), at(0));
    const melt = inspector.records().find((r) => r.kind === 'link-in-melt')!;
    expect(melt.clearanceMm).toBeCloseTo(2 - 5, 9);
    // (its die-body pin at (5, 28) is inside the plate too: a second collision)
    const defects = collisionDefects(inspector.records());
    expect(defects.filter((d) => /over the melt channel/.test(d.message))).toHaveLength(1);
  });
});

describe('linkLayerOrder', () => {
  it('puts a link whose pin crosses another link below it, keeping the given order where free (Kahn)', () => {
    // topological sort of the "pin over line ⇒ below" relation (Kahn, Comm. ACM 5(11), 1962)
    expect(linkLayerOrder(['link_1', 'link_2', 'link_3'], [{ pinLink: 'link_3', lineLink: 'link_1' }])).toEqual([
      'link_2',
      'link_3',
      'link_1',
    ]);
    expect(linkLayerOrder(['link_1', 'link_2'], [])).toEqual(['link_1', 'link_2']);
  });

  it('has no order when two links each cross the other', () => {
    expect(
      linkLayerOrder(
        ['link_1', 'link_2'],
        [
          { pinLink: 'link_1', lineLink: 'link_2' },
          { pinLink: 'link_2', lineLink: 'link_1' },
        ],
      ),
    ).toBeNull();
  });

  it('the inspector reports a pin over another link whatever their layers', () => {
    // link_2's plate pin (end b at (10, 10)) lies on link_1's pin line x = 10: they overlap in plan view
    const parts: ClearanceParts = {
      plates: [],
      links: [
        { id: 'link_1', layer: 4, lengthMm: 30, bodyA: 'die_body', bodyB: 'plate_1' },
        { id: 'link_2', layer: 5, lengthMm: 20, bodyA: 'die_body', bodyB: 'plate_2' },
      ],
      layerOf: new Map([
        ['plate_1', 1],
        ['plate_2', 2],
      ]),
      opening: far,
      pinRadiusMm: 2,
      steelMm: 5,
    };
    const inspector = makeClearanceInspector(parts);
    inspector.inspect((id) => (id === 'link_1' ? { x: 10, y: 0, phi: deg(90) } : { x: -10, y: 10, phi: 0 }), at(0));
    expect(inspector.linkOverlaps()).toEqual([{ pinLink: 'link_2', lineLink: 'link_1' }]);
    // link_2 is above link_1, so its pin passes through link_1's layer: a collision as stacked
    expect(collisionDefects(inspector.records()).map((d) => d.message)).toEqual([
      expect.stringMatching(/^link_2 and link_1 overlap/),
    ]);
  });
});
