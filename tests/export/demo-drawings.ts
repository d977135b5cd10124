import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import DxfParserModule, { type DxfParser as DxfParserClass, type IDxf, type IEntity } from 'dxf-parser';
import { drawingModel } from '../../src/export/index.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { type Plan, planSchedule } from '../../src/pipeline/index.js';

/**
 * The demo schedule (fixtures/demo-edging-strip.json) planned with planSchedule, and its drawing model;
 * `pullerFollowsArea` overrides the demo's own `process.puller_follows_area` (true).
 */
export function planDemo(pullerFollowsArea?: boolean) {
  const wire = JSON.parse(readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
  if (pullerFollowsArea !== undefined) wire.process = { ...wire.process, puller_follows_area: pullerFollowsArea };
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

/** Debian's python3-ezdxf under the system Python (not the first python3 on PATH). */
export const SYSTEM_PYTHON = '/usr/bin/python3';

/** True when /usr/bin/python3 can import ezdxf (Debian's python3-ezdxf; .ci/run installs it). */
export const ezdxfAvailable = spawnSync(SYSTEM_PYTHON, ['-c', 'import ezdxf'], { stdio: 'ignore' }).status === 0;

/** What ezdxf says of one file: audit errors and fixes with their messages, $INSUNITS, model-space entities. */
export interface EzdxfAudit {
  readonly errors: number;
  readonly fixes: number;
  readonly messages: string[];
  readonly insunits: number;
  readonly entities: number;
}

const AUDIT = `
import json, sys, ezdxf
out = {}
for path in sys.argv[1:]:
    doc = ezdxf.readfile(path)
    auditor = doc.audit()
    out[path] = {"errors": len(auditor.errors), "fixes": len(auditor.fixes),
                 "messages": [e.message for e in auditor.errors] + [f.message for f in auditor.fixes],
                 "insunits": doc.header.get("$INSUNITS"), "entities": len(doc.modelspace())}
print(json.dumps(out))
`;

/**
 * Reads every file with ezdxf (`ezdxf.readfile`), audits it (`doc.audit()`) and returns what it found per path;
 * throws when ezdxf cannot read a file at all (the Python run fails).
 */
export function auditWithEzdxf(paths: readonly string[]): Record<string, EzdxfAudit> {
  const run = spawnSync(SYSTEM_PYTHON, ['-c', AUDIT, ...paths], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`ezdxf could not read the drawings: ${run.stderr.slice(-500)}`);
  return JSON.parse(run.stdout) as Record<string, EzdxfAudit>;
}
