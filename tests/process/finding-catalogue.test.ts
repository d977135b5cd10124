import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const read = (path: string) => readFileSync(new URL(`../../${path}`, import.meta.url), 'utf8');

describe('findings catalogue', () => {
  it('api-spec/errors.md lists every finding code the process checks and checkSchedule emit', () => {
    const doc = read('api-spec/errors.md');
    const files = [
      ...readdirSync(new URL('../../src/process/', import.meta.url))
        .filter((f) => f.endsWith('.ts'))
        .map((f) => `src/process/${f}`),
      'src/pipeline/check-schedule.ts',
    ];
    const found = new Set<string>();
    for (const file of files) {
      for (const match of read(file).matchAll(/code: (?:[a-z]+ \? )?'([A-Z_]+)'(?: : '([A-Z_]+)')?/g)) {
        if (match[1]) found.add(match[1]);
        if (match[2]) found.add(match[2]);
      }
    }
    expect(found.size).toBeGreaterThan(10);
    for (const code of found) expect(doc, code).toContain(`\`${code}\``);
  });
});
