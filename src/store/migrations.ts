/**
 * The store's schema, one step per version, applied in order at open inside a transaction each and recorded in the
 * `migrations` table. Never edit a step that has shipped: add the next one.
 */
export const MIGRATIONS: readonly { readonly version: number; readonly name: string; readonly sql: string }[] = [
  {
    version: 1,
    name: 'schedules, plans and results',
    sql: `
      CREATE TABLE schedules (
        hash TEXT PRIMARY KEY,
        name TEXT NOT NULL,
        schedule_json TEXT NOT NULL,
        created_at TEXT NOT NULL
      );
      CREATE TABLE plans (
        id TEXT PRIMARY KEY,
        created_at TEXT NOT NULL,
        name TEXT NOT NULL,
        schedule_hash TEXT NOT NULL REFERENCES schedules(hash),
        status TEXT NOT NULL CHECK (status IN ('queued', 'running', 'done', 'incomplete', 'failed')),
        stage TEXT,
        fraction REAL,
        attempts INTEGER NOT NULL DEFAULT 0,
        started_at TEXT,
        finished_at TEXT,
        error TEXT,
        request_findings_json TEXT NOT NULL DEFAULT '[]',
        client TEXT,
        idempotency_key TEXT
      );
      CREATE UNIQUE INDEX plans_idempotency ON plans (coalesce(client, ''), idempotency_key)
        WHERE idempotency_key IS NOT NULL;
      CREATE INDEX plans_status ON plans (status, created_at);
      CREATE INDEX plans_created ON plans (created_at, id);
      CREATE TABLE results (
        plan_id TEXT PRIMARY KEY REFERENCES plans(id) ON DELETE CASCADE,
        plan_hash TEXT NOT NULL,
        plan_json TEXT NOT NULL,
        report_json TEXT NOT NULL
      );
    `,
  },
  {
    version: 2,
    name: 'downloads rendered with the plan',
    sql: `
      CREATE TABLE artifacts (
        plan_id TEXT NOT NULL REFERENCES results(plan_id) ON DELETE CASCADE,
        name TEXT NOT NULL,
        position INTEGER NOT NULL,
        content_type TEXT NOT NULL,
        disposition TEXT NOT NULL,
        cautions TEXT NOT NULL,
        refusal TEXT,
        body BLOB NOT NULL,
        PRIMARY KEY (plan_id, name)
      ) WITHOUT ROWID;
    `,
  },
  {
    version: 3,
    name: 'schedules compressed; what a queued plan reports kept beside its schedule',
    sql: `
      ALTER TABLE schedules ADD COLUMN schedule_gz BLOB;
      ALTER TABLE schedules ADD COLUMN material TEXT;
      ALTER TABLE schedules ADD COLUMN die_temperature_c REAL;
      UPDATE schedules SET material = json_extract(schedule_json, '$.material'),
        die_temperature_c = json_extract(schedule_json, '$.process.dieTemperatureC');
    `,
  },
  {
    version: 4,
    name: 'plans compressed',
    sql: `
      ALTER TABLE results ADD COLUMN plan_gz BLOB;
    `,
  },
];
