import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../src/config.js';

describe('loadConfig', () => {
  it('gives the documented defaults on an empty environment (README quick start)', () => {
    expect(loadConfig({})).toEqual({
      host: '127.0.0.1',
      port: 8080,
      logLevel: 'info',
      rateLimitPerMinute: 600,
      planTimeLimitS: 20,
    });
  });

  it('reads PLAN_TIME_LIMIT_S and refuses a limit that is not a positive number of seconds', () => {
    expect(loadConfig({ PLAN_TIME_LIMIT_S: '2.5' }).planTimeLimitS).toBe(2.5);
    expect(() => loadConfig({ PLAN_TIME_LIMIT_S: '0' })).toThrow(/PLAN_TIME_LIMIT_S/);
    expect(() => loadConfig({ PLAN_TIME_LIMIT_S: 'soon' })).toThrow(/PLAN_TIME_LIMIT_S/);
  });
});
