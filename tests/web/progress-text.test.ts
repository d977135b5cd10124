import { describe, expect, it } from 'vitest';
import { FINISHED, progressText } from '../../src/web/api.js';

describe('plan progress in words', () => {
  it('progressText says where a plan stands: waiting, running with its share and stage, or finished', () => {
    expect(progressText({ status: 'queued' })).toBe('Waiting for a free worker.');
    expect(progressText({ status: 'running', progress: { stage: 'fit', fraction: 0.254 } })).toBe('Running 25 %: fit.');
    expect(progressText({ status: 'running', progress: null })).toBe('Running.');
    expect(progressText({ status: 'done' })).toBe('Done: the plan meets the request.');
    expect(progressText({ status: 'failed', error: 'no chain fits' })).toBe('Failed: no chain fits');
    expect([...FINISHED].sort()).toEqual(['done', 'failed', 'incomplete']);
  });
});
