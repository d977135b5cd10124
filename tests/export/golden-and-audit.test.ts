import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  drawingModel,
  partIds,
  previewPlots,
  thermalScale,
  writeDieBodyDxf,
  writePartDxf,
  writePartsSheetDxf,
  writePreviewSvg,
  writeStationsDxf,
} from '../../src/export/index.js';
import { auditWithEzdxf, ezdxfAvailable, planDemo } from './demo-drawings.js';

/**
 * Golden files of the demo plan's drawings (tests/export/golden/), with every number rounded to 3 decimals so that
 * round-off in the last digits of the planner does not count. Regenerate after a deliberate change with
 * `UPDATE_GOLDEN=1 npx vitest run tests/export/golden-and-audit.test.ts`, and read the diff before committing it.
 */
const GOLDEN = new URL('./golden/', import.meta.url);
const UPDATE = process.env.UPDATE_GOLDEN === '1';

const demo = planDemo();
const { schedule } = demo;
// the goldens pin the writers on the demo's fitted mechanism: without the plan's step-by-step simulation (the
// drawings then solve their own steps) and with the check's findings only, so that work on the motion stage, which
// has its own tests, does not move them
const plan = { ...demo.plan, simulation: null, findings: demo.plan.check.findings };
const made = drawingModel(plan, schedule);
if (!made.ok) throw new Error(made.reason);
const model = made.model;
const cold = thermalScale('cold', schedule.process.dieTemperatureC);
const drawings: Record<string, string> = {
  'plates.dxf': writePartsSheetDxf(model, cold),
  'die-body.dxf': writeDieBodyDxf(model, cold),
  'stations.dxf': writeStationsDxf(model, cold),
  'preview.svg': writePreviewSvg(model, previewPlots(plan, schedule)),
};
for (const id of partIds(model)) drawings[`plates-${id}.dxf`] = writePartDxf(model, id, cold)!;

/** Every decimal number rounded to 3 decimals (and -0.000 written 0.000). */
function rounded(text: string): string {
  return text.replace(/-?\d+\.\d+/g, (m) => {
    const r = Number(m).toFixed(3);
    return r === '-0.000' ? '0.000' : r;
  });
}

describe('golden drawings of the demo plan (numbers rounded to 3 decimals)', () => {
  for (const [name, text] of Object.entries(drawings)) {
    it(`${name} equals tests/export/golden/${name}`, () => {
      const file = new URL(name, GOLDEN);
      if (UPDATE) {
        mkdirSync(GOLDEN, { recursive: true });
        writeFileSync(file, rounded(text));
      }
      expect(rounded(text)).toBe(readFileSync(file, 'utf8'));
    });
  }
});

describe('strict second reader', () => {
  // the audit reads the drawings of the demo plan as planned, simulation included
  const full = {
    'die-body.dxf': writeDieBodyDxf(demo.model, cold),
    'stations.dxf': writeStationsDxf(demo.model, cold),
  };
  const dir = mkdtempSync(join(tmpdir(), 'drawings-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it.skipIf(!ezdxfAvailable)(
    'ezdxf (Debian python3-ezdxf via /usr/bin/python3) opens every demo DXF, its audit reports no errors and no fixes, $INSUNITS 4 (skipped only when /usr/bin/python3 cannot import ezdxf)',
    () => {
      const files = Object.entries({ ...drawings, ...full })
        .filter(([name]) => name.endsWith('.dxf'))
        .map(([name, text]) => {
          const path = join(dir, name);
          writeFileSync(path, text);
          return path;
        });
      expect(files).toHaveLength(3 + 5);
      const report = auditWithEzdxf(files);
      for (const path of files) {
        const r = report[path]!;
        expect(r.messages, path).toEqual([]);
        expect(r.errors).toBe(0);
        expect(r.fixes).toBe(0);
        // Autodesk DXF reference, HEADER section: $INSUNITS 4 = millimetres
        expect(r.insunits).toBe(4);
        expect(r.entities).toBeGreaterThan(0);
      }
    },
  );

  it.skipIf(!ezdxfAvailable)(
    'the same ezdxf run refuses a truncated drawing, so the check above can fail (skipped only when /usr/bin/python3 cannot import ezdxf)',
    () => {
      const broken = join(dir, 'broken.dxf');
      writeFileSync(broken, drawings['plates.dxf']!.slice(0, 2000));
      expect(() => auditWithEzdxf([broken])).toThrow(/ezdxf could not read/);
    },
  );
});
