import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import type { Schedule } from '../../src/domain/index.js';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import {
  decodeJson,
  encodeJson,
  MIGRATIONS,
  type NewPlan,
  type PlanResult,
  SqlitePlanStore,
  scheduleHash,
  packJson,
  scheduleParts,
  unpackJson,
} from '../../src/store/index.js';
import { fixture } from '../support/test-app.js';

function demoSchedule(name = 'edging-strip-demo'): Schedule {
  const mapped = toSchedule(ScheduleWire.parse({ ...fixture('demo-edging-strip'), name }));
  if (!mapped.ok) throw new Error('the demo fixture must map');
  return mapped.schedule;
}

function newPlan(id: string, createdAt: string, schedule = demoSchedule(), key: string | null = null): NewPlan {
  return {
    id,
    createdAt,
    ...scheduleParts(schedule),
    scheduleHash: scheduleHash(schedule),
    requestFindings: [],
    client: null,
    idempotencyKey: key,
  };
}

const result = (status: PlanResult['status'] = 'done'): PlanResult => ({
  status,
  error: status === 'failed' ? 'why' : null,
  planPacked: packJson({ status, value: Number.NaN }),
  reportJson: '{"status":"done"}',
  planHash: 'a'.repeat(64),
});

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});
const tempPath = () => {
  const dir = mkdtempSync(join(tmpdir(), 'plan-store-'));
  dirs.push(dir);
  return join(dir, 'nested', 'plans.sqlite');
};

describe('SqlitePlanStore', () => {
  it('creates the file and its directory, in WAL mode, with every migration recorded once across reopenings', () => {
    const path = tempPath();
    new SqlitePlanStore(path).close();
    const again = new SqlitePlanStore(path);
    again.close();
    const db = new Database(path, { readonly: true });
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    const applied = db.prepare('SELECT version FROM migrations ORDER BY version').all() as { version: number }[];
    expect(applied.map((r) => r.version)).toEqual(MIGRATIONS.map((m) => m.version));
    db.close();
  });

  it('queues, claims (attempt 1, running), records progress, and finishes with status and result in one write', () => {
    const store = new SqlitePlanStore(':memory:');
    const { entry, created } = store.add(newPlan('p1', '2026-12-02T10:00:00.000Z'));
    expect(created).toBe(true);
    expect(entry).toMatchObject({ id: 'p1', status: 'queued', attempts: 0, progress: null, planHash: null });
    expect(store.get('p1')).toBeUndefined();
    const claimed = store.claimNext('2026-12-02T10:00:01.000Z')!;
    expect(claimed.entry).toMatchObject({ status: 'running', attempts: 1, startedAt: '2026-12-02T10:00:01.000Z' });
    expect(unpackJson(claimed.schedulePacked)).toEqual(demoSchedule());
    expect(store.scheduleHead('p1')).toEqual({ name: demoSchedule().name, material: 'PVC-U', dieTemperatureC: 190 });
    expect(store.claimNext('x')).toBeUndefined();
    store.setProgress('p1', { stage: 'fit', fraction: 0.1 });
    expect(store.entry('p1')?.progress).toEqual({ stage: 'fit', fraction: 0.1 });
    expect(store.finish('p1', result(), '2026-12-02T10:00:02.000Z')).toBe(true);
    expect(store.entry('p1')).toMatchObject({ status: 'done', progress: null, planHash: 'a'.repeat(64) });
    expect(store.report('p1')).toBe('{"status":"done"}');
    // a finished plan is not finished twice
    expect(store.finish('p1', result('failed'), 'later')).toBe(false);
    expect(store.get('p1')?.plan).toEqual({ status: 'done', value: Number.NaN });
    store.close();
  });

  it('puts plans left running back in the queue, oldest first', () => {
    const store = new SqlitePlanStore(':memory:');
    store.add(newPlan('a', '2026-12-02T10:00:00.000Z'));
    store.add(newPlan('b', '2026-12-02T10:00:01.000Z'));
    expect(store.claimNext('t')?.entry.id).toBe('a');
    expect(store.claimNext('t')?.entry.id).toBe('b');
    expect(store.requeueAllRunning().sort()).toEqual(['a', 'b']);
    expect(store.counts()).toEqual({ queued: 2, running: 0 });
    const again = store.claimNext('t')!;
    expect(again.entry).toMatchObject({ id: 'a', attempts: 2 });
    store.close();
  });

  it('returns the earlier plan for an idempotency key used again, per client', () => {
    const store = new SqlitePlanStore(':memory:');
    store.add(newPlan('first', '2026-12-02T10:00:00.000Z', demoSchedule(), 'key-1'));
    const again = store.add(newPlan('second', '2026-12-02T10:00:01.000Z', demoSchedule('other'), 'key-1'));
    expect(again.created).toBe(false);
    expect(again.entry.id).toBe('first');
    expect(store.entry('second')).toBeUndefined();
    const otherClient = store.add({
      ...newPlan('third', '2026-12-02T10:00:02.000Z'),
      client: 'line-2',
      idempotencyKey: 'key-1',
    });
    expect(otherClient.created).toBe(true);
    store.close();
  });

  it('deletes a plan with its result and its schedule when no other plan shares it', () => {
    const store = new SqlitePlanStore(':memory:');
    store.add(newPlan('a', '2026-12-02T10:00:00.000Z'));
    store.add(newPlan('b', '2026-12-02T10:00:01.000Z'));
    store.claimNext('t');
    store.finish('a', result(), 't');
    expect(store.delete('a')).toBe(true);
    expect(store.entry('a')).toBeUndefined();
    expect(store.report('a')).toBeUndefined();
    expect(store.schedule('b')).toBeDefined();
    expect(store.delete('b')).toBe(true);
    expect(store.delete('b')).toBe(false);
    store.close();
  });

  it('lists newest first with status, name and created_since filters, paging by cursor without gaps or repeats', () => {
    const store = new SqlitePlanStore(':memory:');
    for (let i = 0; i < 7; i++) {
      store.add(newPlan(`p${i}`, `2026-12-02T10:00:0${i}.000Z`, demoSchedule(i % 2 ? 'odd' : 'even')));
    }
    const seen: string[] = [];
    let after: string | undefined;
    for (;;) {
      const page = store.list({ limit: 3, ...(after ? { after } : {}) });
      seen.push(...page.items.map((e) => e.id));
      if (!page.next) break;
      after = page.next;
    }
    expect(seen).toEqual(['p6', 'p5', 'p4', 'p3', 'p2', 'p1', 'p0']);
    expect(store.list({ limit: 10, name: 'odd' }).items.map((e) => e.id)).toEqual(['p5', 'p3', 'p1']);
    expect(store.list({ limit: 10, createdSince: '2026-12-02T10:00:05.000Z' }).items).toHaveLength(2);
    store.claimNext('t');
    expect(store.list({ limit: 10, status: 'running' }).items.map((e) => e.id)).toEqual(['p0']);
    store.close();
  });

  it('keeps data across a reopening of the file (nothing lost)', () => {
    const path = tempPath();
    const first = new SqlitePlanStore(path);
    first.add(newPlan('kept', '2026-12-02T10:00:00.000Z'));
    first.close();
    const second = new SqlitePlanStore(path);
    expect(second.entry('kept')?.status).toBe('queued');
    expect(second.schedule('kept')).toEqual(demoSchedule());
    second.close();
  });
});

describe('encodeJson / decodeJson and scheduleHash', () => {
  it('a file of schema version 2 gains the material and die temperature, read from its stored JSON', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plan-store-v2-'));
    const path = join(dir, 'v2.sqlite');
    const db = new Database(path);
    db.exec('CREATE TABLE migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)');
    for (const m of MIGRATIONS.slice(0, 2)) {
      db.exec(m.sql);
      db.prepare('INSERT INTO migrations VALUES (?, ?, ?)').run(m.version, m.name, new Date().toISOString());
    }
    const schedule = { ...demoSchedule(), material: 'HDPE' as const };
    const hash = scheduleHash(schedule);
    db.prepare('INSERT INTO schedules (hash, name, schedule_json, created_at) VALUES (?, ?, ?, ?)').run(
      hash,
      schedule.name,
      encodeJson(schedule),
      '2026-12-01T00:00:00.000Z',
    );
    db.prepare("INSERT INTO plans (id, created_at, name, schedule_hash, status) VALUES ('old', ?, ?, ?, 'queued')").run(
      '2026-12-01T00:00:00.000Z',
      schedule.name,
      hash,
    );
    db.close();
    const store = new SqlitePlanStore(path);
    expect(store.scheduleHead('old')).toEqual({
      name: schedule.name,
      material: 'HDPE',
      dieTemperatureC: schedule.process.dieTemperatureC,
    });
    expect(unpackJson(store.claimNext('2026-12-02T00:00:00.000Z')!.schedulePacked)).toEqual(schedule);
    store.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('a plan finished in a file of schema version 3 (plan stored as JSON text) reads the same after the packing step', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plan-store-v3-'));
    const path = join(dir, 'v3.sqlite');
    const db = new Database(path);
    db.exec('CREATE TABLE migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)');
    for (const m of MIGRATIONS.slice(0, 3)) {
      db.exec(m.sql);
      db.prepare('INSERT INTO migrations VALUES (?, ?, ?)').run(m.version, m.name, new Date().toISOString());
    }
    const schedule = demoSchedule();
    const hash = scheduleHash(schedule);
    const plan = { status: 'done', value: Number.NaN, text: 'kept' };
    db.prepare('INSERT INTO schedules (hash, name, schedule_json, created_at) VALUES (?, ?, ?, ?)').run(
      hash,
      schedule.name,
      encodeJson(schedule),
      '2026-12-01T00:00:00.000Z',
    );
    db.prepare("INSERT INTO plans (id, created_at, name, schedule_hash, status) VALUES ('old', ?, ?, ?, 'done')").run(
      '2026-12-01T00:00:00.000Z',
      schedule.name,
      hash,
    );
    db.prepare("INSERT INTO results (plan_id, plan_hash, plan_json, report_json) VALUES ('old', ?, ?, '{}')").run(
      'b'.repeat(64),
      encodeJson(plan),
    );
    db.close();
    const store = new SqlitePlanStore(path);
    expect(store.get('old')?.plan).toEqual(plan);
    const text = store.resultText('old')!;
    expect(unpackJson(text.planPacked)).toEqual(plan);
    expect(unpackJson(text.schedulePacked)).toEqual(schedule);
    expect(text.planHash).toBe('b'.repeat(64));
    store.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('round-trips NaN and ±Infinity, which plain JSON (RFC 8259) cannot hold', () => {
    const value = { a: Number.NaN, b: [Number.POSITIVE_INFINITY, -1, Number.NEGATIVE_INFINITY], c: { $number: 1 } };
    expect(decodeJson(encodeJson(value))).toEqual(value);
  });

  it('gives the same hash for the same schedule whatever the key order of the request', () => {
    const body = fixture('demo-edging-strip');
    const reordered = Object.fromEntries(Object.entries(body).reverse());
    const a = toSchedule(ScheduleWire.parse(body));
    const b = toSchedule(ScheduleWire.parse(reordered));
    if (!a.ok || !b.ok) throw new Error('must map');
    expect(scheduleHash(a.schedule)).toBe(scheduleHash(b.schedule));
    expect(scheduleHash(a.schedule)).toMatch(/^[0-9a-f]{64}$/);
    expect(scheduleHash({ ...a.schedule, name: 'other' })).not.toBe(scheduleHash(a.schedule));
  });
});
