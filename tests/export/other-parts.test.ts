import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ICircleEntity, ILineEntity, ILwpolylineEntity, ITextEntity } from 'dxf-parser';
import pc from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import {
  DIE_BODY_LAYERS,
  drawingModel,
  PART_LAYERS,
  telescopingHalfLength,
  thermalScale,
  writeDieBodyDxf,
  writePartDxf,
  writePartsSheetDxf,
} from '../../src/export/index.js';
import { type Point, regionArea } from '../../src/geometry/index.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { chainMechanism, type Plan } from '../../src/pipeline/index.js';
import { processCautions } from '../../src/safety/index.js';
import { findMovingSpans } from '../../src/span/index.js';
import { fitChain, plateOutline, resolveChainFitOptions } from '../../src/synthesis/index.js';
import { channelOrifice, closeChain, type P } from '../support/known-chain.js';
import {
  auditWithEzdxf,
  entitiesOn,
  ezdxfAvailable,
  isSimpleRing,
  planDemo,
  readDxf,
  shoelace,
  type Xy,
} from './demo-drawings.js';

/**
 * A plan of the chain alone (no links, no actuators: what a plan shows when nothing drives its chain) fitted to
 * stations made by a known chain whose middle plate is 11, 13 and 15 mm long (a telescoping pair, Shamsudin et al.
 * 2013; the self-consistent case of tests/synthesis/fit-chain.test.ts), with slots or telescoping plates allowed.
 */
function chainOnlyPlan(allow: { allowSlots: boolean; allowTelescoping: boolean }) {
  const start: P = [-6, 16];
  const end: P = [46, 16];
  const shapes = [
    { lengths: [12, 11, 11, 11, 12], bends: [-0.45, 0.0, 0.35] },
    { lengths: [12, 11, 13, 11, 12], bends: [-0.55, -0.05, 0.45] },
    { lengths: [12, 11, 15, 11, 12], bends: [-0.65, -0.1, 0.5] },
  ];
  const orifices = shapes.map((s) => channelOrifice(closeChain(s.lengths, start, end, s.bends, false), 5, 40, 0.01));
  const wire = {
    name: 'known-chain',
    stations: orifices.map((o, i) => ({ position_m: i * 0.5, orifice: { outer: o.outer } })),
  };
  const mapped = toSchedule(wire as Parameters<typeof toSchedule>[0]);
  if (!mapped.ok) throw new Error(JSON.stringify(mapped.problems));
  const schedule = mapped.schedule;
  const spans = findMovingSpans(
    schedule.stations.map((s) => s.orifice),
    { matchToleranceMm: 0.02, ends: null },
  );
  if (spans.status !== 'found') throw new Error('no span');
  const fit = fitChain(
    schedule.stations.map((s) => s.orifice),
    [...spans.spans],
    resolveChainFitOptions({
      toleranceMm: 0.05,
      maxPlates: 8,
      pivotHoleDiameterMm: 4,
      ligamentMm: 3,
      depthMm: 25,
      ...allow,
    }),
  );
  const plan = {
    status: 'incomplete',
    error: null,
    fit,
    mechanisation: null,
    mechanism: chainMechanism(fit),
    motion: null,
    findings: [],
    cautions: processCautions(schedule.material, schedule.process.dieTemperatureC),
  } as unknown as Plan;
  return { plan, schedule, fit };
}

describe('a telescoping pair is drawn as two parts', () => {
  const { plan, schedule, fit } = chainOnlyPlan({ allowSlots: false, allowTelescoping: true });
  const made = drawingModel(plan, schedule);
  if (!made.ok) throw new Error(made.reason);
  const parts = made.model.stations[0]!.parts;

  it('plate_k and plate_k_slide, each with one pin hole on its own pivot', () => {
    // the known chain's third plate telescopes (fitChain finds it: tests/synthesis/fit-chain.test.ts)
    expect(fit.chain.telescoping.map((t) => t.plate)).toEqual([2]);
    const halves = parts.filter((p) => p.kind === 'telescoping half').map((p) => p.id);
    expect(halves).toEqual(['plate_3', 'plate_3_slide']);
    const pivots = fit.chain.pivots[0]!;
    const hot = thermalScale('hot', schedule.process.dieTemperatureC);
    for (const [id, pivot] of [
      ['plate_3', pivots[2]!],
      ['plate_3_slide', pivots[3]!],
    ] as const) {
      const dxf = readDxf(writePartDxf(made.model, id, hot)!);
      const circles = entitiesOn<ICircleEntity>(dxf, 'CIRCLE', PART_LAYERS.holes);
      expect(circles).toHaveLength(1);
      expect(Math.hypot(circles[0]!.center.x - pivot[0], circles[0]!.center.y - pivot[1])).toBeLessThanOrEqual(1e-6);
      const outline = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', PART_LAYERS.outline);
      expect(outline).toHaveLength(1);
      expect(isSimpleRing(outline[0]!.vertices.map((v) => [v.x, v.y]))).toBe(true);
    }
  });

  it('each half is (longest + e) / 2 long: the outline of a plate that long (same area), and the notes say so', () => {
    const pair = made.model.telescoping[0]!;
    const lengths = fit.chain.telescoping[0]!.stationLengthsMm;
    const e = fit.shape.edgeOffsetMm;
    expect(pair.plate).toBe('plate_3');
    expect(pair.pivotsApartMm).toEqual({ min: Math.min(...lengths), max: Math.max(...lengths) });
    expect(pair.halfLengthMm).toBeCloseTo((Math.max(...lengths) + e) / 2, 12);
    expect(pair.overlapAtLongestMm).toBeCloseTo(e, 12);
    const bar = plateOutline([0, 0], [pair.halfLengthMm, 0], fit.shape);
    for (const id of ['plate_3', 'plate_3_slide']) {
      const part = parts.find((p) => p.id === id)!;
      expect(Math.abs(shoelace(part.outline as Xy[]))).toBeCloseTo(regionArea({ outer: bar.outer, holes: [] }), 6);
    }
    const cold = thermalScale('cold', schedule.process.dieTemperatureC);
    const notes = entitiesOn<ITextEntity>(readDxf(writePartDxf(made.model, 'plate_3', cold)!), 'TEXT', 'notes')
      .map((t) => t.text)
      .join(' ');
    expect(notes).toContain('one half of telescoping plate_3');
    // the known chain's plate is 11–15 mm long and e is 5 mm, so each half (10 mm + a 5 mm round end) runs past the
    // other half's pin at the shortest: the drawing says whether the stack lets it pass
    expect(pair.reachPastPinMm).toBeGreaterThan(0);
    expect(notes).toMatch(
      /past the edge of the other half's pin hole, (in a layer that pin does not|IN A LAYER THAT PIN)/,
    );
  });
});

describe('telescoping halves keep the melt edge whole at the longest station', () => {
  // two halves along the x axis, pivots at 0 and d (the longest station), each drawn as plateOutline from its own pivot
  // towards the other, as the drawing model draws them; the pair must cover the one plate the clipping assumes
  const shape = { edgeOffsetMm: 5, depthMm: 25, holeRadiusMm: 2, arcToleranceMm: 0.01 };
  const uncovered = (d: number, half: number): number => {
    const whole = plateOutline([0, 0], [d, 0], shape).outer as Xy[];
    const a = plateOutline([0, 0], [half, 0], shape).outer as Xy[];
    const b = plateOutline([d - half, 0], [d, 0], shape).outer as Xy[];
    const left = pc.difference([whole], [a], [b]);
    return left.reduce((sum, poly) => sum + Math.abs(shoelace(poly[0] as Xy[])), 0);
  };

  it('halves of (longest + e) / 2 leave nothing of the one plate uncovered (polygon-clipping)', () => {
    for (const lengths of [
      [11, 15],
      [10, 30],
      [20, 21],
    ]) {
      const d = Math.max(...lengths);
      expect(uncovered(d, telescopingHalfLength(lengths, 5))).toBeLessThan(1e-6);
    }
  });

  it('halves as long as the shortest station would leave a gap in the melt edge for a long stroke (10 to 30 mm)', () => {
    expect(uncovered(30, 10)).toBeGreaterThan(1);
  });
});

describe('a slotted end is drawn as a slider block and a slot in the die body', () => {
  const { plan, schedule, fit } = chainOnlyPlan({ allowSlots: true, allowTelescoping: false });
  const made = drawingModel(plan, schedule);
  if (!made.ok) throw new Error(made.reason);
  const hot = thermalScale('hot', schedule.process.dieTemperatureC);
  const slotted = fit.chain.start.kind === 'slot' ? 'start' : fit.chain.end.kind === 'slot' ? 'end' : null;

  it('the fit of these stations uses a slot when no plate may telescope', () => {
    expect(slotted).not.toBeNull();
  });

  it('the slider block: a 4e × 2e rectangle with its pin hole on the chain end, on the sheet with the plates', () => {
    const id = `slider_${slotted}`;
    const block = made.model.stations[0]!.parts.find((p) => p.id === id)!;
    expect(block.kind).toBe('slider block');
    const e = fit.shape.edgeOffsetMm;
    // rectangle area: 4e · 2e (the block's size as drawn, 20 mm × 10 mm for e = 5 mm)
    expect(Math.abs(shoelace(block.outline as Xy[]))).toBeCloseTo(8 * e * e, 9);
    const pin = fit.chain.pivots[0]![slotted === 'start' ? 0 : fit.plateCount]!;
    expect(Math.hypot(block.holes[0]!.centre[0] - pin[0], block.holes[0]!.centre[1] - pin[1])).toBeLessThanOrEqual(
      1e-9,
    );
    const sheet = readDxf(writePartsSheetDxf(made.model, hot));
    expect(entitiesOn(sheet, 'LWPOLYLINE', PART_LAYERS.outline)).toHaveLength(made.model.stations[0]!.parts.length);
  });

  it("the die body shows the slot: the pin's path from its first to its last travel over the stations", () => {
    const end = slotted === 'start' ? fit.chain.start : fit.chain.end;
    if (end.kind !== 'slot') throw new Error('no slot');
    const dxf = readDxf(writeDieBodyDxf(made.model, hot));
    const lines = entitiesOn<ILineEntity>(dxf, 'LINE', DIE_BODY_LAYERS.slots);
    expect(lines).toHaveLength(1);
    const travel = Math.max(...end.travelMm) - Math.min(...end.travelMm);
    const [a, b] = lines[0]!.vertices;
    expect(Math.hypot(b!.x - a!.x, b!.y - a!.y)).toBeCloseTo(travel, 5);
    expect(entitiesOn(dxf, 'LWPOLYLINE', DIE_BODY_LAYERS.slots)).toHaveLength(1);
  });

  it('the slot is a pocket the slider block fits at both ends of its travel, 0.02 mm wider and longer (polygon-clipping)', () => {
    const end = slotted === 'start' ? fit.chain.start : fit.chain.end;
    if (end.kind !== 'slot') throw new Error('no slot');
    const e = fit.shape.edgeOffsetMm;
    const dxf = readDxf(writeDieBodyDxf(made.model, hot));
    const pocket = entitiesOn<ILwpolylineEntity>(dxf, 'LWPOLYLINE', DIE_BODY_LAYERS.slots)[0]!;
    const ring = pocket.vertices.map((v) => [v.x, v.y] as [number, number]);
    const f = hot.factor;
    // a rectangle: (travel + 4e + 0.02) × (2e + 0.02), scaled with the drawing (shoelace area; DXF coordinates are
    // written to a few micrometres)
    const travel = Math.max(...end.travelMm) - Math.min(...end.travelMm);
    expect(Math.abs(shoelace(ring as Xy[]))).toBeCloseTo((travel + 4 * e + 0.02) * (2 * e + 0.02) * f * f, 4);
    // the slider block (4e × 2e round its pin) at either end of the pin's travel lies inside the pocket: nothing of
    // it is left outside by polygon-clipping's difference
    for (const t of [Math.min(...end.travelMm), Math.max(...end.travelMm)]) {
      const c = [end.origin[0] + t * end.direction[0], end.origin[1] + t * end.direction[1]];
      const [u, v] = [end.direction, [-end.direction[1], end.direction[0]]];
      const corner = (a: number, b: number): [number, number] => [
        f * (c[0]! + a * 2 * e * u[0] + b * e * v[0]!),
        f * (c[1]! + a * 2 * e * u[1] + b * e * v[1]!),
      ];
      const blockRing = [corner(-1, -1), corner(1, -1), corner(1, 1), corner(-1, 1)];
      const outside = pc.difference([blockRing], [ring]);
      const left = outside.reduce((sum, poly) => sum + Math.abs(shoelace(poly[0] as Xy[])), 0);
      expect(left).toBeLessThan(1e-6);
    }
    const note = entitiesOn<ITextEntity>(dxf, 'TEXT', 'notes')
      .map((t) => t.text)
      .join(' ');
    expect(note).toContain('+ 0.020 mm sliding clearance');
  });
});

describe('a link pin near a plate edge sits in a boss', () => {
  it("the plate's cut outline is the clipping outline united with a disc of radius e round the pin (polygon-clipping)", () => {
    const { plan, schedule, model } = planDemo();
    const e = plan.fit!.shape.edgeOffsetMm;
    // move the demo's link pin on plate_2 to 1 mm inside the plate's back edge (depth 25 mm from the melt edge,
    // i.e. 20 mm behind the pivot line): nearer than e to the edge, so the clearance model draws a boss there
    const joints = plan.mechanism!.joints;
    const a = joints.find((j) => j.id === 'pivot_1')!.stationPositions;
    const b = joints.find((j) => j.id === 'pivot_2')!.stationPositions;
    const pinAt = (i: number): Point => {
      const [p, q] = [a[i]!, b[i]!];
      const len = Math.hypot(q[0] - p[0], q[1] - p[1]);
      const u = [(q[0] - p[0]) / len, (q[1] - p[1]) / len] as const;
      return [(p[0] + q[0]) / 2 - u[1] * 19, (p[1] + q[1]) / 2 + u[0] * 19];
    };
    const moved = {
      ...plan,
      mechanism: {
        ...plan.mechanism!,
        joints: joints.map((j) =>
          j.id === 'link_1_b' ? { ...j, stationPositions: j.stationPositions.map((_, i) => pinAt(i)) } : j,
        ),
      },
    } as Plan;
    const made = drawingModel(moved, schedule);
    if (!made.ok) throw new Error(made.reason);
    const bossed = made.model.stations[0]!.parts.find((p) => p.id === 'plate_2')!;
    const plain = model.stations[0]!.parts.find((p) => p.id === 'plate_2')!;
    expect(plain.exactOutline).toBe(true);
    expect(bossed.exactOutline).toBe(false);
    const pin = pinAt(0);
    const disc: Xy[] = Array.from({ length: 24 }, (_, k) => [
      pin[0] + e * Math.cos((2 * Math.PI * k) / 24),
      pin[1] + e * Math.sin((2 * Math.PI * k) / 24),
    ]);
    const expected = pc.union([plain.outline as Xy[]], [disc]);
    const area = (mp: pc.MultiPolygon) => mp.reduce((s, poly) => s + Math.abs(shoelace(poly[0] as Xy[])), 0);
    expect(area(expected)).toBeGreaterThan(Math.abs(shoelace(plain.outline as Xy[])) + 1);
    // clipper rounds to 0.1 µm: the areas agree to 1e-3 mm²
    expect(Math.abs(Math.abs(shoelace(bossed.outline as Xy[])) - area(expected))).toBeLessThanOrEqual(1e-3);
    expect(bossed.holes.map((h) => h.joint)).toEqual(['pivot_1', 'pivot_2', 'link_1_b']);
  });
});

describe('telescoping halves, slider blocks and slots pass the strict reader too', () => {
  it.skipIf(!ezdxfAvailable)(
    'ezdxf (Debian python3-ezdxf via /usr/bin/python3) audits the sheet, each part and the die body of both chain-only plans with no errors or fixes (skipped only when /usr/bin/python3 cannot import ezdxf)',
    () => {
      const dir = mkdtempSync(join(tmpdir(), 'drawings-'));
      try {
        const files: string[] = [];
        for (const allow of [
          { allowSlots: false, allowTelescoping: true },
          { allowSlots: true, allowTelescoping: false },
        ]) {
          const { plan, schedule } = chainOnlyPlan(allow);
          const made = drawingModel(plan, schedule);
          if (!made.ok) throw new Error(made.reason);
          const cold = thermalScale('cold', schedule.process.dieTemperatureC);
          const tag = allow.allowSlots ? 'slot' : 'telescoping';
          const write = (name: string, text: string) => {
            const path = join(dir, `${tag}-${name}.dxf`);
            writeFileSync(path, text);
            files.push(path);
          };
          write('plates', writePartsSheetDxf(made.model, cold));
          write('die-body', writeDieBodyDxf(made.model, cold));
          for (const part of made.model.stations[0]!.parts) write(part.id, writePartDxf(made.model, part.id, cold)!);
        }
        const report = auditWithEzdxf(files);
        for (const path of files) {
          expect(report[path]!.messages, path).toEqual([]);
          expect(report[path]!.errors + report[path]!.fixes).toBe(0);
          // Autodesk DXF reference, HEADER section: $INSUNITS 4 = millimetres
          expect(report[path]!.insunits).toBe(4);
        }
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
