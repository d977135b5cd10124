import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import {
  MIGRATIONS,
  type PlanResult,
  SqlitePlanStore,
  type StoredArtifact,
  scheduleParts,
  packJson,
  unpackJson,
} from '../../src/store/index.js';

const dir = mkdtempSync(join(tmpdir(), 'store-artifacts-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const schedule = { name: 'strip', material: 'PVC-U', process: { dieTemperatureC: 190 } } as never;
const artifact = (name: string, text: string, refusal: string | null = null): StoredArtifact => ({
  name,
  contentType: 'text/csv; charset=utf-8',
  disposition: refusal ? '' : `attachment; filename="${name}"`,
  cautions: 'HOT_MELT',
  refusal,
  body: new TextEncoder().encode(text),
});
const result = (artifacts?: StoredArtifact[]): PlanResult => ({
  status: 'done',
  error: null,
  planPacked: packJson({}),
  reportJson: '{}',
  planHash: 'a'.repeat(64),
  ...(artifacts ? { artifacts } : {}),
});

/** Queues a plan and marks it running, as the job queue does. */
function running(store: SqlitePlanStore, id: string): void {
  store.add({
    id,
    createdAt: new Date().toISOString(),
    ...scheduleParts(schedule),
    scheduleHash: id,
    requestFindings: [],
    client: null,
    idempotencyKey: null,
  });
  expect(store.claimNext(new Date().toISOString())?.entry.id).toBe(id);
}

describe('SqlitePlanStore artifacts', () => {
  it('a file with only the first schema version gains the artifacts table and keeps its plans', () => {
    const path = join(dir, 'v1.sqlite');
    const db = new Database(path);
    db.exec('CREATE TABLE migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)');
    db.exec(MIGRATIONS[0]!.sql);
    db.prepare('INSERT INTO migrations VALUES (1, ?, ?)').run(MIGRATIONS[0]!.name, new Date().toISOString());
    db.close();
    const store = new SqlitePlanStore(path);
    running(store, 'old');
    expect(store.finish('old', result(), new Date().toISOString())).toBe(true);
    expect(store.artifactNames('old')).toEqual([]);
    expect(store.addArtifacts('old', [artifact('setpoints.csv', 'a,b\n')])).toBe(true);
    // stored once: a second render of the same plan changes nothing
    expect(store.addArtifacts('old', [artifact('setpoints.csv', 'other\n')])).toBe(false);
    expect(Buffer.from(store.artifact('old', 'setpoints.csv')!.body).toString()).toBe('a,b\n');
    store.close();
  });

  it('finish writes the artifacts with the result, in their order; delete removes them', () => {
    const store = new SqlitePlanStore(join(dir, 'new.sqlite'));
    running(store, 'p');
    const files = [artifact('z.csv', 'z'), artifact('a.csv', 'a'), artifact('plates.dxf', 'why', 'no_mechanism')];
    expect(store.finish('p', result(files), new Date().toISOString())).toBe(true);
    expect(store.artifactNames('p')).toEqual(['z.csv', 'a.csv', 'plates.dxf']);
    expect(store.artifact('p', 'plates.dxf')).toMatchObject({ refusal: 'no_mechanism', disposition: '' });
    expect(store.resultText('p')).toMatchObject({ planHash: 'a'.repeat(64) });
    expect(unpackJson(store.resultText('p')!.planPacked)).toEqual({});
    expect(store.addArtifacts('p', [artifact('more.csv', 'm')])).toBe(false);
    expect(store.delete('p')).toBe(true);
    expect(store.artifactNames('p')).toEqual([]);
    expect(store.artifact('p', 'z.csv')).toBeUndefined();
    store.close();
  });

  it('a plan that is no longer running stores neither result nor artifacts', () => {
    const store = new SqlitePlanStore(':memory:');
    running(store, 'q');
    expect(store.requeue('q')).toBe(true);
    expect(store.finish('q', result([artifact('a.csv', 'a')]), new Date().toISOString())).toBe(false);
    expect(store.artifactNames('q')).toEqual([]);
    store.close();
  });
});
