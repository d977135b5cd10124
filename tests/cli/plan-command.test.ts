import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { type CommandIo, EXIT, runPlanCommand } from '../../src/cli/plan-command.js';

/** `npm run plan`: the demo planned offline into a directory, every table and drawing written; bad input exits 2. */
const dir = mkdtempSync(join(tmpdir(), 'plan-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const demo = fileURLToPath(new URL('../../fixtures/demo-edging-strip.json', import.meta.url));

function capture(): CommandIo & { out: () => string; err: () => string } {
  let out = '';
  let err = '';
  return {
    stdout: (t) => {
      out += t;
    },
    stderr: (t) => {
      err += t;
    },
    interactive: false,
    out: () => out,
    err: () => err,
  };
}

describe('npm run plan', () => {
  it('plans the demo into --out: plan.json done, tables read back, drawings are DXF and SVG; --json summary; progress on stderr', async () => {
    const io = capture();
    const out = join(dir, 'demo');
    expect(await runPlanCommand([demo, '--out', out, '--json'], io)).toBe(EXIT.done);
    const summary = JSON.parse(io.out());
    expect(summary.status).toBe('done');
    expect(summary.files).toEqual(
      expect.arrayContaining(['plan.json', 'check.json', 'setpoints.csv', 'cam-table.csv']),
    );
    expect(summary.cautions).toContain('HOT_MELT');
    expect(io.err()).toMatch(/planning: fit 10%/);
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(plan.status).toBe('done');
    expect(plan.stations).toHaveLength(4);
    const rows = parse(readFileSync(join(out, 'setpoints.csv'), 'utf8')) as string[][];
    expect(rows[0]!.slice(0, 3)).toEqual(['position_m', 'time_s', 'actuator_1_deg']);
    for (const f of summary.files.filter((n: string) => n.endsWith('.dxf'))) {
      expect(readFileSync(join(out, f), 'utf8')).toMatch(/^\s*0\s*\r?\nSECTION/);
    }
    if (summary.files.includes('preview.svg')) expect(readFileSync(join(out, 'preview.svg'), 'utf8')).toMatch(/<svg/);
  }, 120_000);

  it('exits 2 naming every bad field of a bad schedule, and on a usage error', async () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(
      bad,
      JSON.stringify({
        stations: [
          {
            position_m: 'x',
            orifice: {
              outer: [
                [0, 0],
                [1, 0],
              ],
            },
          },
        ],
      }),
    );
    const io = capture();
    expect(await runPlanCommand([bad, '--out', join(dir, 'bad')], io)).toBe(EXIT.badInput);
    expect(io.err()).toMatch(/cannot be planned \(invalid_schedule\)/);
    expect(io.err()).toMatch(/stations\[0\]\.position_m: /);
    expect(io.err()).toMatch(/stations\[0\]\.orifice\.outer: /);
    const usage = capture();
    expect(await runPlanCommand([demo], usage)).toBe(EXIT.badInput);
    expect(usage.err()).toMatch(/--out <dir>/);
  }, 60_000);
});
