import { readFileSync } from 'node:fs';
import DxfParserModule, { type DxfParser as DxfParserClass, type IDxf, type IEntity } from 'dxf-parser';
import { drawingModel } from '../../src/export/index.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { type Plan, planSchedule } from '../../src/pipeline/index.js';

/** The demo schedule (fixtures/demo-edging-strip.json) planned with planSchedule, and its drawing model. */
export function planDemo() {
  const wire = JSON.parse(readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
  const mapped = toSchedule(wire);
  if (!mapped.ok) throw new Error(JSON.stringify(mapped.problems));
  const plan: Plan = planSchedule(mapped.schedule);
  const made = drawingModel(plan, mapped.schedule);
  if (!made.ok) throw new Error(made.reason);
  return { schedule: mapped.schedule, plan, model: made.model };
}

// dxf-parser ships CommonJS with a default export: under NodeNext the default import is the module object
type ParserConstructor = new () => DxfParserClass;
const parserModule = DxfParserModule as unknown as ParserConstructor & { default?: ParserConstructor };
const DxfParser: ParserConstructor = parserModule.default ?? parserModule;

/** A DXF text read back by dxf-parser 1.1.2, an independent reader. */
export function readDxf(text: string): IDxf {
  const parsed = new DxfParser().parseSync(text);
  if (!parsed) throw new Error('dxf-parser returned nothing');
  return parsed;
}

export type Xy = [number, number];

/** Entities of one type on one layer. */
export function entitiesOn<T extends IEntity>(dxf: IDxf, type: string, layer: string): T[] {
  return dxf.entities.filter((e) => e.type === type && e.layer === layer) as T[];
}

/** Shoelace area of a ring, mm² (positive counter-clockwise). */
export function shoelace(ring: readonly (readonly [number, number])[]): number {
  let sum = 0;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    sum += a[0] * b[1] - b[0] * a[1];
  }
  return sum / 2;
}

/** True when no two non-adjacent edges of the ring meet (a simple polygon). */
export function isSimpleRing(ring: readonly (readonly [number, number])[]): boolean {
  const n = ring.length;
  const cross = (o: readonly number[], a: readonly number[], b: readonly number[]) =>
    (a[0]! - o[0]!) * (b[1]! - o[1]!) - (a[1]! - o[1]!) * (b[0]! - o[0]!);
  for (let i = 0; i < n; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % n]!;
    for (let j = i + 1; j < n; j++) {
      if (j === i || (j + 1) % n === i || j === (i + 1) % n) continue;
      const c = ring[j]!;
      const d = ring[(j + 1) % n]!;
      const d1 = cross(c, d, a);
      const d2 = cross(c, d, b);
      const d3 = cross(a, b, c);
      const d4 = cross(a, b, d);
      if (d1 * d2 < 0 && d3 * d4 < 0) return false;
    }
  }
  return true;
}
