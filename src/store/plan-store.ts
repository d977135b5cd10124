import type { Finding, MaterialName, Schedule } from '../domain/index.js';
import type { Plan } from '../pipeline/index.js';
import { packJson } from './json-codec.js';

/** One finished plan: the validated schedule it came from and the plan itself (plain data). */
export interface PlanRecord {
  readonly id: string;
  /** ISO 8601 time of creation. */
  readonly createdAt: string;
  readonly schedule: Schedule;
  readonly plan: Plan;
}

/**
 * Where a plan job stands. `queued` and `running` have no result yet; `done`, `incomplete` (computed but short of the
 * request, see the plan's outcome) and `failed` are finished and carry a stored result.
 */
export type PlanStatus = 'queued' | 'running' | 'done' | 'incomplete' | 'failed';

/** The statuses that carry a stored result. */
export const FINISHED_STATUSES: readonly PlanStatus[] = Object.freeze(['done', 'incomplete', 'failed']);

/** How far a running plan has come: the pipeline stage and an overall fraction 0–1 (coarse, stage by stage). */
export interface PlanProgress {
  readonly stage: string;
  readonly fraction: number;
}

/** What the store knows about a plan job, without its schedule or result. */
export interface PlanEntry {
  readonly id: string;
  readonly createdAt: string;
  /** The schedule's name. */
  readonly name: string;
  /** SHA-256 of the normalised schedule (see `scheduleHash`), hex. */
  readonly scheduleHash: string;
  readonly status: PlanStatus;
  /** Set while running; null otherwise. */
  readonly progress: PlanProgress | null;
  /** How many times a worker has started this plan (a plan interrupted by a restart starts again). */
  readonly attempts: number;
  readonly startedAt: string | null;
  readonly finishedAt: string | null;
  /** Why a failed plan failed. */
  readonly error: string | null;
  /** SHA-256 of the stored plan, hex; null until finished. Downloads derive their ETag from it. */
  readonly planHash: string | null;
}

/** What the store keeps beside a schedule, so a queued plan is described without decoding its schedule. */
export interface ScheduleHead {
  readonly name: string;
  readonly material: MaterialName;
  readonly dieTemperatureC: number;
}

/** A schedule as `NewPlan` carries it: packed, with its head. */
export function scheduleParts(schedule: Schedule): {
  readonly schedulePacked: Uint8Array;
  readonly head: ScheduleHead;
} {
  return {
    schedulePacked: packJson(schedule),
    head: { name: schedule.name, material: schedule.material, dieTemperatureC: schedule.process.dieTemperatureC },
  };
}

/** A plan job to store, queued. */
export interface NewPlan {
  readonly id: string;
  readonly createdAt: string;
  /** The validated schedule, packed by `packJson` (see `scheduleParts`). */
  readonly schedulePacked: Uint8Array;
  readonly head: ScheduleHead;
  readonly scheduleHash: string;
  /** Findings about the request itself (unknown or unused fields), merged into the plan's findings when it is done. */
  readonly requestFindings: readonly Finding[];
  /** Who asked (the token's name; null without tokens) and their Idempotency-Key, if any. */
  readonly client: string | null;
  readonly idempotencyKey: string | null;
}

/** A queued plan handed to a worker, its schedule packed by `packJson` (the worker unpacks it). */
export interface ClaimedPlan {
  readonly entry: PlanEntry;
  readonly schedulePacked: Uint8Array;
  readonly requestFindings: readonly Finding[];
}

/** A finished plan as the worker wrote it out: the plan, its wire report, and the hash of the plan. */
export interface PlanResult {
  readonly status: 'done' | 'incomplete' | 'failed';
  readonly error: string | null;
  /** The plan, packed by `packJson` (its hash is of the text `encodeJson` writes). */
  readonly planPacked: Uint8Array;
  /** The `GET /v1/plans/{id}` report, JSON, sent as stored. */
  readonly reportJson: string;
  readonly planHash: string;
  /** The plan's downloads rendered by the worker, stored with the result in the same transaction. @default none */
  readonly artifacts?: readonly StoredArtifact[];
}

/**
 * One download of a finished plan as rendered when the plan finished: the file's bytes and the headers that describe
 * it, or (with `refusal`, an error code of the catalogue) the reason the plan has no such file, its message as body.
 */
export interface StoredArtifact {
  /** The download's path below `/v1/plans/{id}/`, with its query when not the default (`die-body.dxf?dimensions=hot`). */
  readonly name: string;
  readonly contentType: string;
  /** The Content-Disposition header; empty for a refusal. */
  readonly disposition: string;
  /** The plan's caution codes, comma separated (the X-Cautions header). */
  readonly cautions: string;
  readonly refusal: string | null;
  readonly body: Uint8Array;
}

/** Filters and paging of the plan list; newest first. */
export interface PlanListQuery {
  readonly status?: PlanStatus;
  readonly name?: string;
  /** ISO 8601: plans created at or after. */
  readonly createdSince?: string;
  readonly limit: number;
  /** Opaque cursor from the previous page's `next`. */
  readonly after?: string;
}

export interface PlanPage {
  readonly items: readonly PlanEntry[];
  /** Cursor of the next page; null on the last page. */
  readonly next: string | null;
}

/**
 * Where plans are kept. Every write is one transaction: a plan is queued with its schedule, or finished with its
 * status and result, completely or not at all.
 */
export interface PlanStore {
  /**
   * Queues a plan. With an idempotency key that the same client used before, nothing is stored and the earlier plan
   * is returned with `created: false` (the caller compares schedule hashes).
   */
  add(plan: NewPlan): { readonly entry: PlanEntry; readonly created: boolean };
  entry(id: string): PlanEntry | undefined;
  /** A finished plan (`done`, `incomplete` or `failed`); undefined when unknown, queued or running. */
  get(id: string): PlanRecord | undefined;
  /** The stored `GET /v1/plans/{id}` report of a finished plan, JSON. */
  report(id: string): string | undefined;
  /** A finished plan's stored download; undefined when none is stored under that name. */
  artifact(id: string, name: string): StoredArtifact | undefined;
  /** Names of a plan's stored downloads in the order they were rendered (none for a plan stored before downloads were rendered with the plan). */
  artifactNames(id: string): readonly string[];
  /** Stores downloads of a finished plan that has none yet (plans stored before they were rendered); false otherwise. */
  addArtifacts(id: string, artifacts: readonly StoredArtifact[]): boolean;
  /** A finished plan as stored, unparsed: its schedule and plan JSON (for a worker to read) and its hash. */
  resultText(id: string):
    | {
        readonly createdAt: string;
        /** The schedule, packed by `packJson`. */
        readonly schedulePacked: Uint8Array;
        /** The plan, packed by `packJson`. */
        readonly planPacked: Uint8Array;
        readonly planHash: string;
      }
    | undefined;
  /** The plan's schedule, whatever its status. */
  schedule(id: string): Schedule | undefined;
  /** The plan's schedule's name, material and die temperature, whatever its status (no decoding). */
  scheduleHead(id: string): ScheduleHead | undefined;
  /** The request findings stored with a plan. */
  requestFindings(id: string): readonly Finding[];
  /** The oldest queued plan, now marked running (attempts + 1), or undefined when none waits. */
  claimNext(startedAt: string): ClaimedPlan | undefined;
  /** Records a running plan's progress; ignored once it is no longer running. */
  setProgress(id: string, progress: PlanProgress): void;
  /** Stores a running plan's result and status together; false (nothing written) when it is no longer running. */
  finish(id: string, result: PlanResult, finishedAt: string): boolean;
  /** Puts a running plan back in the queue (shutdown); false when it was not running. */
  requeue(id: string): boolean;
  /** Puts every running plan back in the queue (start-up after a crash); returns their ids. */
  requeueAllRunning(): string[];
  /** Deletes a plan, its result and its idempotency key; false when unknown. */
  delete(id: string): boolean;
  list(query: PlanListQuery): PlanPage;
  /** How many plans are queued and running. */
  counts(): { readonly queued: number; readonly running: number };
  /** Throws when the store cannot be read. */
  ping(): void;
  close(): void;
}
