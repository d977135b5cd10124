import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'better-sqlite3';
import type { Finding, MaterialName, Schedule } from '../domain/index.js';
import type { Plan } from '../pipeline/index.js';
import { decodeJson, encodeJson, packJson, packText, unpackJson } from './json-codec.js';
import { MIGRATIONS } from './migrations.js';
import type {
  ClaimedPlan,
  NewPlan,
  PlanEntry,
  PlanListQuery,
  PlanPage,
  PlanProgress,
  PlanRecord,
  PlanResult,
  PlanStatus,
  PlanStore,
  ScheduleHead,
  StoredArtifact,
} from './plan-store.js';

interface PlanRow {
  id: string;
  created_at: string;
  name: string;
  schedule_hash: string;
  status: PlanStatus;
  stage: string | null;
  fraction: number | null;
  attempts: number;
  started_at: string | null;
  finished_at: string | null;
  error: string | null;
  plan_hash: string | null;
}

/** A stored schedule: packed (`schedule_gz`), or as JSON text in a file written before schedules were packed. */
interface ScheduleRow {
  schedule_json: string;
  schedule_gz: Buffer | null;
}

/** A stored schedule, packed by `packJson` (one written as text before schedules were packed is packed now). */
function packedSchedule(row: ScheduleRow): Uint8Array {
  return row.schedule_gz ?? packJson(decodeJson(row.schedule_json));
}

/** A stored plan: packed (`plan_gz`), or as JSON text in a file written before plans were packed. */
interface PlanRow {
  plan_json: string;
  plan_gz: Buffer | null;
}

/** A stored plan, packed by `packJson` (one written as text before plans were packed is packed now). */
function packedPlan(row: PlanRow): Uint8Array {
  return row.plan_gz ?? packText(row.plan_json);
}

/** Bytes as better-sqlite3 binds them (a Buffer); a view of the same memory, not a copy. */
function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

const ENTRY_COLUMNS = `p.id, p.created_at, p.name, p.schedule_hash, p.status, p.stage, p.fraction, p.attempts,
  p.started_at, p.finished_at, p.error, r.plan_hash`;

/** Decoded finished plans kept in memory, so repeated downloads of one plan do not parse it again. */
const RECORD_CACHE_SIZE = 8;
/** Finished plans' entries and reports kept in memory (they never change), so reading a plan touches no disk. */
const FINISHED_CACHE_SIZE = 256;
/** Most characters of reports kept in memory (about 32 MiB of ASCII); a larger report is read from disk each time. */
const REPORT_CACHE_CHARS = 32 * 1024 * 1024;

/**
 * Plans in one SQLite file (better-sqlite3, synchronous): write-ahead log, full sync, foreign keys, schema versions in
 * `migrations`. `path` ':memory:' keeps everything in memory (tests). The parent directory is created.
 */
export class SqlitePlanStore implements PlanStore {
  private readonly db: Database.Database;
  private readonly cache = new Map<string, PlanRecord>();
  private readonly finishedEntries = new Map<string, PlanEntry>();
  private readonly reports = new Map<string, string>();
  private reportChars = 0;
  private readonly statements;

  constructor(path: string) {
    if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
    this.db = new Database(path);
    this.db.pragma('busy_timeout = 5000');
    if (path !== ':memory:') this.db.pragma('journal_mode = WAL');
    this.db.pragma('synchronous = FULL');
    this.db.pragma('foreign_keys = ON');
    migrate(this.db);
    const db = this.db;
    this.statements = {
      entry: db.prepare(`SELECT ${ENTRY_COLUMNS} FROM plans p LEFT JOIN results r ON r.plan_id = p.id WHERE p.id = ?`),
      byKey: db.prepare(
        `SELECT ${ENTRY_COLUMNS} FROM plans p LEFT JOIN results r ON r.plan_id = p.id
         WHERE coalesce(p.client, '') = coalesce(?, '') AND p.idempotency_key = ?`,
      ),
      insertSchedule: db.prepare(
        `INSERT OR IGNORE INTO schedules (hash, name, schedule_json, schedule_gz, created_at, material, die_temperature_c)
         VALUES (?, ?, '', ?, ?, ?, ?)`,
      ),
      insertPlan: db.prepare(
        `INSERT INTO plans (id, created_at, name, schedule_hash, status, request_findings_json, client, idempotency_key)
         VALUES (?, ?, ?, ?, 'queued', ?, ?, ?)`,
      ),
      schedule: db.prepare(
        `SELECT s.schedule_json, s.schedule_gz FROM plans p JOIN schedules s ON s.hash = p.schedule_hash
         WHERE p.id = ?`,
      ),
      scheduleHead: db.prepare(
        `SELECT s.name, s.material, s.die_temperature_c FROM plans p JOIN schedules s ON s.hash = p.schedule_hash
         WHERE p.id = ?`,
      ),
      requestFindings: db.prepare('SELECT request_findings_json AS json FROM plans WHERE id = ?'),
      finished: db.prepare(
        `SELECT p.created_at, s.schedule_json, s.schedule_gz, r.plan_json, r.plan_gz FROM plans p
         JOIN schedules s ON s.hash = p.schedule_hash JOIN results r ON r.plan_id = p.id WHERE p.id = ?`,
      ),
      report: db.prepare('SELECT report_json AS json FROM results WHERE plan_id = ?'),
      resultText: db.prepare(
        `SELECT p.created_at, s.schedule_json, s.schedule_gz, r.plan_json, r.plan_gz, r.plan_hash FROM plans p
         JOIN schedules s ON s.hash = p.schedule_hash JOIN results r ON r.plan_id = p.id WHERE p.id = ?`,
      ),
      artifact: db.prepare(
        `SELECT name, content_type, disposition, cautions, refusal, body FROM artifacts
         WHERE plan_id = ? AND name = ?`,
      ),
      artifactNames: db.prepare('SELECT name FROM artifacts WHERE plan_id = ? ORDER BY position'),
      anyArtifact: db.prepare('SELECT 1 AS one FROM artifacts WHERE plan_id = ? LIMIT 1'),
      hasResult: db.prepare('SELECT 1 AS one FROM results WHERE plan_id = ?'),
      insertArtifact: db.prepare(
        `INSERT INTO artifacts (plan_id, name, position, content_type, disposition, cautions, refusal, body)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      oldestQueued: db.prepare("SELECT id FROM plans WHERE status = 'queued' ORDER BY created_at, rowid LIMIT 1"),
      start: db.prepare(
        `UPDATE plans SET status = 'running', attempts = attempts + 1, started_at = ?, stage = 'queued', fraction = 0
         WHERE id = ? AND status = 'queued'`,
      ),
      progress: db.prepare("UPDATE plans SET stage = ?, fraction = ? WHERE id = ? AND status = 'running'"),
      finish: db.prepare(
        `UPDATE plans SET status = ?, error = ?, finished_at = ?, stage = NULL, fraction = NULL
         WHERE id = ? AND status = 'running'`,
      ),
      insertResult: db.prepare(
        `INSERT OR REPLACE INTO results (plan_id, plan_hash, plan_json, plan_gz, report_json)
         VALUES (?, ?, '', ?, ?)`,
      ),
      requeue: db.prepare(
        "UPDATE plans SET status = 'queued', stage = NULL, fraction = NULL WHERE id = ? AND status = 'running'",
      ),
      running: db.prepare("SELECT id FROM plans WHERE status = 'running'"),
      scheduleOf: db.prepare('SELECT schedule_hash AS hash FROM plans WHERE id = ?'),
      deletePlan: db.prepare('DELETE FROM plans WHERE id = ?'),
      deleteOrphanSchedule: db.prepare(
        'DELETE FROM schedules WHERE hash = ? AND NOT EXISTS (SELECT 1 FROM plans WHERE schedule_hash = ?)',
      ),
      counts: db.prepare(
        "SELECT sum(status = 'queued') AS queued, sum(status = 'running') AS running FROM plans WHERE status IN ('queued', 'running')",
      ),
      ping: db.prepare('SELECT 1 AS one'),
    };
  }

  add(plan: NewPlan): { entry: PlanEntry; created: boolean } {
    return this.db.transaction(() => {
      if (plan.idempotencyKey !== null) {
        const earlier = this.statements.byKey.get(plan.client, plan.idempotencyKey) as PlanRow | undefined;
        if (earlier) return { entry: toEntry(earlier), created: false };
      }
      this.statements.insertSchedule.run(
        plan.scheduleHash,
        plan.head.name,
        asBuffer(plan.schedulePacked),
        plan.createdAt,
        plan.head.material,
        plan.head.dieTemperatureC,
      );
      this.statements.insertPlan.run(
        plan.id,
        plan.createdAt,
        plan.head.name,
        plan.scheduleHash,
        encodeJson(plan.requestFindings),
        plan.client,
        plan.idempotencyKey,
      );
      return { entry: this.entry(plan.id)!, created: true };
    })();
  }

  entry(id: string): PlanEntry | undefined {
    const known = this.finishedEntries.get(id);
    if (known) return known;
    const row = this.statements.entry.get(id) as PlanRow | undefined;
    if (!row) return undefined;
    const entry = toEntry(row);
    if (entry.planHash !== null) remember(this.finishedEntries, id, entry, FINISHED_CACHE_SIZE);
    return entry;
  }

  get(id: string): PlanRecord | undefined {
    const cached = this.cache.get(id);
    if (cached) return cached;
    const row = this.statements.finished.get(id) as (ScheduleRow & PlanRow & { created_at: string }) | undefined;
    if (!row) return undefined;
    const record: PlanRecord = {
      id,
      createdAt: row.created_at,
      schedule: unpackJson<Schedule>(packedSchedule(row)),
      plan: unpackJson<Plan>(packedPlan(row)),
    };
    remember(this.cache, id, record, RECORD_CACHE_SIZE);
    return record;
  }

  report(id: string): string | undefined {
    const known = this.reports.get(id);
    if (known !== undefined) return known;
    const json = (this.statements.report.get(id) as { json: string } | undefined)?.json;
    if (json === undefined || json.length > REPORT_CACHE_CHARS / 8) return json;
    this.reports.set(id, json);
    this.reportChars += json.length;
    while (this.reports.size > FINISHED_CACHE_SIZE || this.reportChars > REPORT_CACHE_CHARS) {
      const oldest = this.reports.keys().next().value!;
      this.reportChars -= this.reports.get(oldest)!.length;
      this.reports.delete(oldest);
    }
    return json;
  }

  artifact(id: string, name: string): StoredArtifact | undefined {
    const row = this.statements.artifact.get(id, name) as
      | {
          name: string;
          content_type: string;
          disposition: string;
          cautions: string;
          refusal: string | null;
          body: Buffer;
        }
      | undefined;
    if (!row) return undefined;
    return {
      name: row.name,
      contentType: row.content_type,
      disposition: row.disposition,
      cautions: row.cautions,
      refusal: row.refusal,
      body: row.body,
    };
  }

  artifactNames(id: string): readonly string[] {
    return (this.statements.artifactNames.all(id) as { name: string }[]).map((r) => r.name);
  }

  addArtifacts(id: string, artifacts: readonly StoredArtifact[]): boolean {
    return this.db.transaction(() => {
      if (!this.statements.hasResult.get(id) || this.statements.anyArtifact.get(id)) return false;
      this.insertArtifacts(id, artifacts);
      return true;
    })();
  }

  resultText(id: string) {
    const row = this.statements.resultText.get(id) as
      | (ScheduleRow & PlanRow & { created_at: string; plan_hash: string })
      | undefined;
    if (!row) return undefined;
    return {
      createdAt: row.created_at,
      schedulePacked: packedSchedule(row),
      planPacked: packedPlan(row),
      planHash: row.plan_hash,
    };
  }

  private insertArtifacts(id: string, artifacts: readonly StoredArtifact[]): void {
    artifacts.forEach((a, position) => {
      const body = asBuffer(a.body);
      this.statements.insertArtifact.run(
        id,
        a.name,
        position,
        a.contentType,
        a.disposition,
        a.cautions,
        a.refusal,
        body,
      );
    });
  }

  schedule(id: string): Schedule | undefined {
    const row = this.statements.schedule.get(id) as ScheduleRow | undefined;
    return row ? unpackJson<Schedule>(packedSchedule(row)) : undefined;
  }

  scheduleHead(id: string): ScheduleHead | undefined {
    const row = this.statements.scheduleHead.get(id) as
      | { name: string; material: MaterialName; die_temperature_c: number }
      | undefined;
    return row ? { name: row.name, material: row.material, dieTemperatureC: row.die_temperature_c } : undefined;
  }

  requestFindings(id: string): readonly Finding[] {
    const row = this.statements.requestFindings.get(id) as { json: string } | undefined;
    return row ? decodeJson<Finding[]>(row.json) : [];
  }

  claimNext(startedAt: string): ClaimedPlan | undefined {
    return this.db.transaction(() => {
      const next = this.statements.oldestQueued.get() as { id: string } | undefined;
      if (!next) return undefined;
      this.statements.start.run(startedAt, next.id);
      return {
        entry: this.entry(next.id)!,
        schedulePacked: packedSchedule(this.statements.schedule.get(next.id) as ScheduleRow),
        requestFindings: this.requestFindings(next.id),
      };
    })();
  }

  setProgress(id: string, progress: PlanProgress): void {
    this.statements.progress.run(progress.stage, progress.fraction, id);
  }

  finish(id: string, result: PlanResult, finishedAt: string): boolean {
    return this.db.transaction(() => {
      const changed = this.statements.finish.run(result.status, result.error, finishedAt, id).changes;
      if (changed === 0) return false;
      this.statements.insertResult.run(id, result.planHash, asBuffer(result.planPacked), result.reportJson);
      this.insertArtifacts(id, result.artifacts ?? []);
      return true;
    })();
  }

  requeue(id: string): boolean {
    return this.statements.requeue.run(id).changes > 0;
  }

  requeueAllRunning(): string[] {
    return this.db.transaction(() => {
      const ids = (this.statements.running.all() as { id: string }[]).map((r) => r.id);
      for (const id of ids) this.statements.requeue.run(id);
      return ids;
    })();
  }

  delete(id: string): boolean {
    this.cache.delete(id);
    this.finishedEntries.delete(id);
    this.reportChars -= this.reports.get(id)?.length ?? 0;
    this.reports.delete(id);
    return this.db.transaction(() => {
      const row = this.statements.scheduleOf.get(id) as { hash: string } | undefined;
      if (!row) return false;
      this.statements.deletePlan.run(id);
      this.statements.deleteOrphanSchedule.run(row.hash, row.hash);
      return true;
    })();
  }

  list(query: PlanListQuery): PlanPage {
    const where: string[] = [];
    const params: unknown[] = [];
    if (query.status !== undefined) {
      where.push('p.status = ?');
      params.push(query.status);
    }
    if (query.name !== undefined) {
      where.push('p.name = ?');
      params.push(query.name);
    }
    if (query.createdSince !== undefined) {
      where.push('p.created_at >= ?');
      params.push(query.createdSince);
    }
    const after = query.after === undefined ? null : readCursor(query.after);
    if (after) {
      where.push('(p.created_at, p.id) < (?, ?)');
      params.push(after.createdAt, after.id);
    }
    const sql = `SELECT ${ENTRY_COLUMNS} FROM plans p LEFT JOIN results r ON r.plan_id = p.id
      ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
      ORDER BY p.created_at DESC, p.id DESC LIMIT ?`;
    const rows = this.db.prepare(sql).all(...params, query.limit + 1) as PlanRow[];
    const items = rows.slice(0, query.limit).map(toEntry);
    const last = items[items.length - 1];
    return { items, next: rows.length > query.limit && last ? writeCursor(last) : null };
  }

  counts(): { queued: number; running: number } {
    const row = this.statements.counts.get() as { queued: number | null; running: number | null };
    return { queued: row.queued ?? 0, running: row.running ?? 0 };
  }

  ping(): void {
    this.statements.ping.get();
  }

  close(): void {
    if (this.db.open) this.db.close();
  }
}

/** Keeps `value` under `key`, dropping the oldest past `size`. */
function remember<T>(map: Map<string, T>, key: string, value: T, size: number): void {
  map.set(key, value);
  if (map.size > size) map.delete(map.keys().next().value!);
}

/** True when `cursor` is one `list` could have written. */
export function isPlanCursor(cursor: string): boolean {
  return readCursor(cursor) !== null;
}

function writeCursor(entry: PlanEntry): string {
  return Buffer.from(`${entry.createdAt}|${entry.id}`, 'utf8').toString('base64url');
}

function readCursor(cursor: string): { createdAt: string; id: string } | null {
  const text = Buffer.from(cursor, 'base64url').toString('utf8');
  const bar = text.indexOf('|');
  if (bar < 1 || bar === text.length - 1) return null;
  return { createdAt: text.slice(0, bar), id: text.slice(bar + 1) };
}

function toEntry(row: PlanRow): PlanEntry {
  return {
    id: row.id,
    createdAt: row.created_at,
    name: row.name,
    scheduleHash: row.schedule_hash,
    status: row.status,
    progress: row.status === 'running' ? { stage: row.stage ?? 'queued', fraction: row.fraction ?? 0 } : null,
    attempts: row.attempts,
    startedAt: row.started_at,
    finishedAt: row.finished_at,
    error: row.error,
    planHash: row.plan_hash ?? null,
  };
}

function migrate(db: Database.Database): void {
  db.exec(
    'CREATE TABLE IF NOT EXISTS migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)',
  );
  const applied = new Set(
    (db.prepare('SELECT version FROM migrations').all() as { version: number }[]).map((r) => r.version),
  );
  for (const m of MIGRATIONS) {
    if (applied.has(m.version)) continue;
    db.transaction(() => {
      db.exec(m.sql);
      db.prepare('INSERT INTO migrations (version, name, applied_at) VALUES (?, ?, ?)').run(
        m.version,
        m.name,
        new Date().toISOString(),
      );
    })();
  }
}
