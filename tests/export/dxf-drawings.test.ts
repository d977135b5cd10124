import type { ICircleEntity, ILwpolylineEntity, ITextEntity } from 'dxf-parser';
import pc from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import {
  asciiText,
  DIE_BODY_LAYERS,
  drawingModel,
  PART_LAYERS,
  PIN_HOLE_FIT_CLEARANCE_MM,
  partIds,
  SHEET_GAP_MM,
  stationLayers,
  thermalScale,
  writeDieBodyDxf,
  writePartDxf,
  writePartsSheetDxf,
  writeStationsDxf,
} from '../../src/export/index.js';
import { regionArea } from '../../src/geometry/index.js';
import { entitiesOn, isSimpleRing, planDemo, readDxf, shoelace, type Xy } from './demo-drawings.js';

const demo = planDemo();
const { plan, model, schedule } = demo;
const hot = thermalScale('hot', schedule.process.dieTemperatureC);
const cold = thermalScale('cold', schedule.process.dieTemperatureC);
const mechanism = plan.mechanism!;
/** The plan's joint point at the first station, die-body frame, mm. */
const jointAt = (id: string): Xy => [...mechanism.joints.find((j) => j.id === id)!.stationPositions[0]!] as Xy;
const ringOf = (e: ILwpolylineEntity): Xy[] => e.vertices.map((v) => [v.x, v.y]);
const texts = (text: string) => entitiesOn<ITextEntity>(readDxf(text), 'TEXT', 'notes').map((t) => t.text);
const holeDiameter = schedule.plates.pivotHoleDiameterMm + PIN_HOLE_FIT_CLEARANCE_MM;
/** polygon-clipping's area of a multipolygon, mm² (outer rings minus holes). */
const pcArea = (mp: pc.MultiPolygon) =>
  mp.reduce(
    (sum, poly) => sum + poly.reduce((s, ring, k) => s + (k === 0 ? 1 : -1) * Math.abs(shoelace(ring as Xy[])), 0),
    0,
  );

describe('per-part DXF of the demo plan, read back with dxf-parser', () => {
  it('the demo plan has parts to draw: 4 plates and 1 link, ids as the mechanism bodies', () => {
    // fixtures/demo-edging-strip.json is made by a known die of 4 plates and one binary link (docs/MODEL.md §6)
    expect(partIds(model)).toEqual(['plate_1', 'plate_2', 'plate_3', 'plate_4', 'link_1']);
    for (const id of partIds(model)) expect(mechanism.bodies.map((b) => b.id)).toContain(id);
  });

  for (const id of ['plate_1', 'plate_2', 'plate_3', 'plate_4', 'link_1']) {
    it(`${id}.dxf: $INSUNITS 4, one closed cut outline, a circle per pin hole on the plan's joint points within 1e-6 mm`, () => {
      const dxf = readDxf(writePartDxf(model, id, hot)!);
      // Autodesk DXF reference, HEADER section: $INSUNITS 4 = millimetres
      expect(dxf.header.$INSUNITS).toBe(4);
      const outlines = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.outline);
      expect(outlines).toHaveLength(1);
      expect(outlines[0]!.shape).toBe(true);
      const part = model.stations[0]!.parts.find((p) => p.id === id)!;
      const circles = entitiesOn<ICircleEntity>(dxf, 'CIRCLE', PART_LAYERS.holes);
      expect(circles).toHaveLength(part.holes.length);
      // the holes of a plate sit on its pivots (and link pins): the plan's own joint points at station 1
      const joints = part.holes.map((h) => jointAt(h.joint));
      for (const [k, c] of circles.entries()) {
        expect(Math.abs(c.center.x - joints[k]![0])).toBeLessThanOrEqual(1e-6);
        expect(Math.abs(c.center.y - joints[k]![1])).toBeLessThanOrEqual(1e-6);
        // diameter: the schedule's pivot hole (plates.pivot_hole_diameter_mm, 4 mm) + the stated 0.02 mm clearance
        expect(2 * c.radius).toBeCloseTo(4.02, 9);
      }
      // centre marks: two lines per hole
      expect(entitiesOn(dxf, 'LINE', PART_LAYERS.marks)).toHaveLength(2 * part.holes.length);
    });
  }

  it("plate_1 … plate_4: the pivot holes are on the plan's pivots pivot_{k-1} and pivot_k", () => {
    for (let k = 1; k <= 4; k++) {
      const circles = entitiesOn<ICircleEntity>(
        readDxf(writePartDxf(model, `plate_${k}`, hot)!),
        'CIRCLE',
        PART_LAYERS.holes,
      );
      const centres = circles.map((c) => [c.center.x, c.center.y]);
      for (const pivot of [jointAt(`pivot_${k - 1}`), jointAt(`pivot_${k}`)]) {
        expect(centres.some((c) => Math.hypot(c[0]! - pivot[0], c[1]! - pivot[1]) <= 1e-6)).toBe(true);
      }
    }
  });

  it("plate outlines are simple polygons whose area equals the plate the plan's clipping used (polygon-clipping, 1e-3 mm²)", () => {
    for (let k = 1; k <= 4; k++) {
      const dxf = readDxf(writePartDxf(model, `plate_${k}`, hot)!);
      const ring = ringOf(entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.outline)[0]!);
      expect(isSimpleRing(ring)).toBe(true);
      // the fit's own clipping outline of plate k at station 1 (plan.fit.plates), read through polygon-clipping
      const clipped = plan.fit!.plates[0]![k - 1]!.outer.map((p) => [p[0], p[1]] as Xy);
      const drawnArea = pcArea(pc.union([ring]));
      const clipArea = pcArea(pc.union([clipped]));
      expect(Math.abs(drawnArea - clipArea)).toBeLessThanOrEqual(1e-3);
      // and the two outlines lie on each other (the fit's pivots differ from the driven ones by round-off)
      expect(pcArea(pc.xor([ring], [clipped]))).toBeLessThanOrEqual(1e-2);
    }
  });

  it("the drawn plates reproduce the plan's achieved orifice at every station: opening − plates, clipped by polygon-clipping (0.02 mm²)", () => {
    // the die model of docs/MODEL.md §2: the orifice is the opening minus the union of the plates (pins fill the holes)
    const opening = plan.fit!.opening.outer.map((p) => [p[0], p[1]] as Xy);
    model.stations.forEach((s, i) => {
      const plates = s.parts.filter((p) => p.kind === 'plate').map((p) => [p.outline.map((q) => [q[0], q[1]] as Xy)]);
      const open = pc.difference([opening], ...(plates as pc.Polygon[]));
      const target = schedule.stations[i]!.orifice.outer.map((p) => [p[0], p[1]] as Xy);
      // the piece overlapping the target most is the orifice (the plan's rule, src/synthesis/achieved-orifice.ts)
      const piece = open.reduce((best, poly) =>
        pcArea(pc.intersection(poly, [target])) > pcArea(pc.intersection(best, [target])) ? poly : best,
      );
      const planned = plan.mechanisation!.stations[i]!.achievedOrifice;
      expect(Math.abs(pcArea([piece]) - Math.abs(shoelace(planned.outer as Xy[])))).toBeLessThanOrEqual(0.02);
    });
  });

  it('plates carry their melt edge on its own layer, from one round end to the other; links have none', () => {
    for (let k = 1; k <= 4; k++) {
      const dxf = readDxf(writePartDxf(model, `plate_${k}`, hot)!);
      const edges = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.melt);
      expect(edges).toHaveLength(1);
      expect(edges[0]!.shape).toBe(false);
      // the straight melt edge runs parallel to the pivot line at e = hole radius + ligament = 5 mm (docs/MODEL.md §2)
      const [a, b] = [jointAt(`pivot_${k - 1}`), jointAt(`pivot_${k}`)];
      for (const v of edges[0]!.vertices) {
        const cross =
          ((b[0] - a[0]) * (v.y - a[1]) - (b[1] - a[1]) * (v.x - a[0])) / Math.hypot(b[0] - a[0], b[1] - a[1]);
        expect(cross).toBeCloseTo(-5, 5);
      }
    }
    expect(entitiesOn(readDxf(writePartDxf(model, 'link_1', hot)!), 'LWPOLYLINE', PART_LAYERS.melt)).toHaveLength(0);
  });

  it('notes name the part, its stack layer, thickness, steel, units, hot or cold and the cautions', () => {
    const notes = texts(writePartDxf(model, 'plate_2', cold)!).join('\n');
    expect(notes).toContain('plate_2: plate, stack layer 2 of 5, 6.000 mm thick');
    expect(notes).toContain('Units: millimetres');
    expect(notes).toContain('DIMENSIONS COLD');
    expect(notes).toContain('steel');
    expect(texts(writePartDxf(model, 'plate_2', hot)!).join('\n')).toContain('DIMENSIONS HOT');
  });

  it("link_1.dxf: its two pin holes are the link's length apart, and its outline a capsule of half width e round them", () => {
    const link = plan.mechanisation!.links[0]!;
    const dxf = readDxf(writePartDxf(model, 'link_1', hot)!);
    const [a, b] = entitiesOn<ICircleEntity>(dxf, 'CIRCLE', PART_LAYERS.holes).map((c) => c.center);
    // a binary link keeps its pins a constant distance apart (Erdman, Sandor & Kota): the plan's link length
    expect(Math.hypot(b!.x - a!.x, b!.y - a!.y)).toBeCloseTo(link.lengthMm, 5);
    // capsule (stadium) area: 2e·L + π e² (polygonal arcs lose under 0.1 %)
    const e = plan.fit!.shape.edgeOffsetMm;
    const ring = ringOf(entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.outline)[0]!);
    const stadium = 2 * e * link.lengthMm + Math.PI * e * e;
    expect(Math.abs(shoelace(ring)) / stadium).toBeGreaterThan(0.999);
    expect(Math.abs(shoelace(ring)) / stadium).toBeLessThanOrEqual(1);
    expect(texts(writePartDxf(model, 'link_1', hot)!).join(' ')).toContain(
      `link_1_ground to link_1_b ${link.lengthMm.toFixed(3)} mm apart`,
    );
  });

  it('an unknown part id gives null', () => {
    expect(writePartDxf(model, 'plate_9', hot)).toBeNull();
  });

  it('cold dimensions: every hole centre and diameter is the plan value divided by 1 + 11.3e-6 · (190 − 20)', () => {
    // linear thermal expansion, H13 mean 11.3 µm/(m·K) 20–204 °C (docs/MODEL.md §5, steel data sheets)
    const growth = 1 + 11.3e-6 * (190 - 20);
    const circles = entitiesOn<ICircleEntity>(
      readDxf(writePartDxf(model, 'plate_3', cold)!),
      'CIRCLE',
      PART_LAYERS.holes,
    );
    const pivot = jointAt('pivot_2');
    expect(circles[0]!.center.x).toBeCloseTo(pivot[0] / growth, 6);
    expect(circles[0]!.center.y).toBeCloseTo(pivot[1] / growth, 6);
    expect(2 * circles[0]!.radius).toBeCloseTo(holeDiameter / growth, 6);
  });
});

describe('combined sheet plates.dxf', () => {
  const dxf = readDxf(writePartsSheetDxf(model, cold));
  const outlines = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.outline).map(ringOf);

  it('one closed outline per part and every pin hole, $INSUNITS 4', () => {
    expect(dxf.header.$INSUNITS).toBe(4);
    expect(outlines).toHaveLength(5);
    const holes = model.stations[0]!.parts.reduce((n, p) => n + p.holes.length, 0);
    expect(entitiesOn(dxf, 'CIRCLE', PART_LAYERS.holes)).toHaveLength(holes);
  });

  it('no two parts overlap, and each is at least the sheet gap from the others (polygon-clipping, pairwise)', () => {
    for (let i = 0; i < outlines.length; i++) {
      for (let j = i + 1; j < outlines.length; j++) {
        expect(pcArea(pc.intersection([outlines[i]!], [outlines[j]!]))).toBe(0);
      }
    }
    // bounding boxes are apart by the gap at least along one axis
    const boxes = outlines.map((r) => ({
      minX: Math.min(...r.map((p) => p[0])),
      maxX: Math.max(...r.map((p) => p[0])),
      minY: Math.min(...r.map((p) => p[1])),
      maxY: Math.max(...r.map((p) => p[1])),
    }));
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i]!;
        const b = boxes[j]!;
        const apart = Math.max(b.minX - a.maxX, a.minX - b.maxX, b.minY - a.maxY, a.minY - b.maxY);
        expect(apart).toBeGreaterThanOrEqual(SHEET_GAP_MM - 1e-6);
      }
    }
  });

  it('each part keeps its shape on the sheet: outline areas equal the per-part drawings (within the 1e-6 mm rounding, 1e-4 mm²)', () => {
    const areas = partIds(model).map((id) =>
      Math.abs(
        shoelace(
          ringOf(
            entitiesOn<ILwpolylineEntity>(
              readDxf(writePartDxf(model, id, cold)!),
              'LWPOLYLINE',
              PART_LAYERS.outline,
            )[0]!,
          ),
        ),
      ),
    );
    expect(outlines.map((r) => Math.abs(shoelace(r)))).toEqual(areas.map((a) => expect.closeTo(a, 4)));
  });

  it('a parts list with one line per part', () => {
    const list = entitiesOn<ITextEntity>(dxf, 'TEXT', 'parts-list').map((t) => t.text);
    expect(list[0]).toContain('PARTS LIST');
    for (const id of partIds(model)) expect(list.some((l) => l.includes(`${id}:`))).toBe(true);
    expect(list).toHaveLength(1 + 5);
  });
});

describe('die-body.dxf', () => {
  const dxf = readDxf(writeDieBodyDxf(model, hot));

  it("the fixed opening is the plan's die opening, vertex for vertex (1e-6 mm)", () => {
    const rings = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', DIE_BODY_LAYERS.opening).map(ringOf);
    expect(rings).toHaveLength(1);
    const opening = plan.fit!.opening.outer;
    expect(rings[0]).toHaveLength(opening.length);
    rings[0]!.forEach((p, i) => {
      expect(Math.abs(p[0] - opening[i]![0])).toBeLessThanOrEqual(1e-6);
      expect(Math.abs(p[1] - opening[i]![1])).toBeLessThanOrEqual(1e-6);
    });
  });

  it('a pin hole at every die-body joint of the plan: the chain ends pivot_0, pivot_4 and the link ground pin', () => {
    const circles = entitiesOn<ICircleEntity>(dxf, 'CIRCLE', DIE_BODY_LAYERS.holes);
    expect(circles).toHaveLength(3);
    for (const id of ['pivot_0', 'pivot_4', 'link_1_ground']) {
      const p = jointAt(id);
      expect(circles.some((c) => Math.hypot(c.center.x - p[0], c.center.y - p[1]) <= 1e-6)).toBe(true);
    }
  });

  it('an actuator mount at the actuated joint pivot_0', () => {
    const mounts = entitiesOn<ICircleEntity>(dxf, 'CIRCLE', DIE_BODY_LAYERS.actuators);
    expect(mounts).toHaveLength(1);
    const p = jointAt('pivot_0');
    expect(Math.hypot(mounts[0]!.center.x - p[0], mounts[0]!.center.y - p[1])).toBeLessThanOrEqual(1e-6);
  });

  it('the swept area holds every part at every station (each part minus the area under 1e-3 mm², polygon-clipping)', () => {
    const swept = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', DIE_BODY_LAYERS.swept).map(ringOf);
    expect(swept.length).toBeGreaterThan(0);
    const [first, ...rest] = swept.map((r) => [r] as pc.Polygon);
    const envelope = pc.union(first!, ...rest);
    const stations = readDxf(writeStationsDxf(model, hot));
    for (let i = 0; i < model.stations.length; i++) {
      const parts = entitiesOn<ILwpolylineEntity>(stations, 'LWPOLYLINE', stationLayers(i).parts).map(ringOf);
      expect(parts).toHaveLength(5);
      for (const part of parts) expect(pcArea(pc.difference([part], envelope))).toBeLessThanOrEqual(1e-3);
    }
    expect(texts(writeDieBodyDxf(model, hot)).join(' ')).toContain(
      "61 of the 901 steps of the plan's simulated motion",
    );
  });

  it('without the plan simulation the drawings solve 8 steps per transition themselves, 4 × 7 = 28 between the 4 stations of the repeat', () => {
    const own = drawingModel({ ...plan, simulation: null }, schedule);
    if (!own.ok) throw new Error(own.reason);
    // periodic demo (repeat 1.5 m): 4 transitions, 7 configurations strictly between each pair of stations
    expect(own.model.sweepNote).toContain('28 configurations between them');
    // the envelope of the solved steps and of the simulated steps cover the same area within 1 % (both sample the motion)
    const area = (m: typeof model) => m.sweptEnvelope.reduce((sum, r) => sum + regionArea(r), 0);
    expect(Math.abs(area(own.model) - area(model)) / area(model)).toBeLessThan(0.01);
  });
});

describe('stations.dxf', () => {
  const dxf = readDxf(writeStationsDxf(model, hot));

  it("each station's target orifice is the schedule's, and its achieved orifice has the plan's area", () => {
    model.stations.forEach((_, i) => {
      const layers = stationLayers(i);
      const target = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', layers.target).map(ringOf);
      const given = schedule.stations[i]!.orifice.outer;
      expect(target[0]).toHaveLength(given.length);
      for (const [k, p] of target[0]!.entries()) {
        expect(Math.hypot(p[0] - given[k]![0], p[1] - given[k]![1])).toBeLessThanOrEqual(1e-6);
      }
      const achieved = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', layers.achieved).map(ringOf);
      const planned = plan.mechanisation!.stations[i]!.achievedOrifice;
      expect(achieved).toHaveLength(1 + planned.holes.length);
      expect(Math.abs(shoelace(achieved[0]!))).toBeCloseTo(Math.abs(shoelace(planned.outer as Xy[])), 4);
    });
  });
});

describe('every drawing', () => {
  const drawings = {
    'plate_1.dxf': writePartDxf(model, 'plate_1', cold)!,
    'plates.dxf': writePartsSheetDxf(model, cold),
    'die-body.dxf': writeDieBodyDxf(model, cold),
    'stations.dxf': writeStationsDxf(model, cold),
  };

  it('carries the safety cautions of the plan, every hazard named, deferring to local codes and plant practice', () => {
    for (const text of Object.values(drawings)) {
      const lines = entitiesOn<ITextEntity>(readDxf(text), 'TEXT', 'safety-cautions').map((t) => t.text);
      const all = lines.join(' ');
      expect(all).toContain('SAFETY CAUTIONS');
      expect(all).toContain('local codes and plant practice');
      for (const c of plan.cautions) expect(all).toContain(asciiText(c.hazard));
    }
  });

  it('is the same bytes when written again, also after other drawings were written in between', () => {
    expect(writePartDxf(model, 'plate_1', cold)).toBe(drawings['plate_1.dxf']);
    expect(writeStationsDxf(model, cold)).toBe(drawings['stations.dxf']);
    expect(writePartsSheetDxf(model, cold)).toBe(drawings['plates.dxf']);
  });

  it('writes a schedule name with a line break and non-ASCII letters as one line of plain ASCII text', () => {
    const odd = { ...model, scheduleName: 'strip\n1 – Ä' };
    const dxf = readDxf(writePartsSheetDxf(odd, cold));
    const list = entitiesOn<ITextEntity>(dxf, 'TEXT', 'parts-list').map((t) => t.text);
    expect(list[0]).toContain('strip?1 - ?');
    expect(entitiesOn(dxf, 'LWPOLYLINE', PART_LAYERS.outline)).toHaveLength(5);
  });

  it('holds numbers with at most 6 decimals and no NaN or exponent', () => {
    for (const text of Object.values(drawings)) {
      expect(text).not.toMatch(/NaN|Infinity/);
      expect(text).not.toMatch(/^-?\d+(\.\d+)?e[-+]?\d+$/m);
      expect(text).not.toMatch(/^-?\d+\.\d{7,}$/m);
    }
  });
});
