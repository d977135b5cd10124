import { availableParallelism } from 'node:os';
import { describe, expect, it } from 'vitest';
import { loadConfig, parseApiTokens } from '../../src/config.js';

describe('loadConfig', () => {
  it('gives the documented defaults on an empty environment (README quick start)', () => {
    expect(loadConfig({})).toEqual({
      host: '127.0.0.1',
      hostIgnored: null,
      port: 8080,
      logLevel: 'info',
      rateLimitPerMinute: 600,
      planTimeLimitS: 20,
      databasePath: './data/plans.sqlite',
      planWorkers: Math.max(1, availableParallelism() - 1),
      shutdownGraceS: 3,
      apiTokens: [],
    });
  });

  it('reads PLAN_TIME_LIMIT_S and refuses a limit that is not a positive number of seconds', () => {
    expect(loadConfig({ PLAN_TIME_LIMIT_S: '2.5' }).planTimeLimitS).toBe(2.5);
    expect(() => loadConfig({ PLAN_TIME_LIMIT_S: '0' })).toThrow(/PLAN_TIME_LIMIT_S/);
    expect(() => loadConfig({ PLAN_TIME_LIMIT_S: 'soon' })).toThrow(/PLAN_TIME_LIMIT_S/);
  });

  it('reads DATABASE_PATH, PLAN_WORKERS and SHUTDOWN_GRACE_S, refusing workers that are not 1–64', () => {
    const c = loadConfig({ DATABASE_PATH: '/var/lib/dmp/plans.sqlite', PLAN_WORKERS: '3', SHUTDOWN_GRACE_S: '5' });
    expect([c.databasePath, c.planWorkers, c.shutdownGraceS]).toEqual(['/var/lib/dmp/plans.sqlite', 3, 5]);
    expect(() => loadConfig({ PLAN_WORKERS: '0' })).toThrow(/PLAN_WORKERS/);
  });

  it('without API tokens listens on loopback whatever HOST says, and says which HOST it ignored', () => {
    expect(loadConfig({ HOST: '0.0.0.0' })).toMatchObject({ host: '127.0.0.1', hostIgnored: '0.0.0.0' });
    const withTokens = loadConfig({ HOST: '0.0.0.0', API_TOKENS: 'line-1:write:0123456789abcdef0123' });
    expect(withTokens).toMatchObject({ host: '0.0.0.0', hostIgnored: null });
  });
});

describe('parseApiTokens', () => {
  it('reads name:scope:token entries, a token may contain ":"', () => {
    expect(parseApiTokens('mes:read:aaaaaaaaaaaaaaaa, line-1:write:bbbb:bbbbbbbbbbbbbb')).toEqual([
      { name: 'mes', scope: 'read', token: 'aaaaaaaaaaaaaaaa' },
      { name: 'line-1', scope: 'write', token: 'bbbb:bbbbbbbbbbbbbb' },
    ]);
  });

  it('refuses a bad entry naming its position and name, never its secret', () => {
    const secret = 'short-secret';
    let message = '';
    try {
      parseApiTokens(`mes:read:${secret}`);
    } catch (err) {
      message = (err as Error).message;
    }
    expect(message).toMatch(/API_TOKENS entry 1 \("mes"\): the token must be at least 16 characters/);
    expect(message).not.toContain(secret);
    expect(() => parseApiTokens('mes:admin:aaaaaaaaaaaaaaaa')).toThrow(/scope must be read or write/);
    expect(() => parseApiTokens('a:read:aaaaaaaaaaaaaaaa,a:write:bbbbbbbbbbbbbbbb')).toThrow(/used twice/);
  });
});
