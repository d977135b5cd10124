import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const read = (path: string) => readFileSync(new URL(`../../${path}`, import.meta.url), 'utf8');

describe('findings catalogue: the motion stage', () => {
  it('api-spec/errors.md lists every finding code the motion simulation and the motion check emit', () => {
    const doc = read('api-spec/errors.md');
    const found = new Set<string>();
    const files = [
      'src/pipeline/motion-findings.ts',
      'src/pipeline/motion-limit-finding.ts',
      'src/pipeline/plan-schedule.ts',
    ];
    for (const file of files) {
      for (const match of read(file).matchAll(/'((?:MOTION|ACTUATOR)_[A-Z_]+)'/g)) found.add(match[1]!);
    }
    // the simulation's own codes and the transition limit check
    expect(found.size).toBeGreaterThanOrEqual(10);
    for (const code of found) expect(doc, code).toContain(`\`${code}\``);
  });
});
