import type { Schedule } from '../domain/index.js';
import { type ClaimedPlan, type PlanProgress, type PlanStore, unpackJson } from '../store/index.js';
import { failedPlan, planResult } from './plan-result.js';
import type { WorkerPool } from './worker-pool.js';

/** Settings of the plan queue. */
export interface PlanJobsOptions {
  readonly store: PlanStore;
  readonly pool: WorkerPool;
  /** Plans computed at once (the pool's plan threads). */
  readonly concurrency: number;
  /** Seconds after which a plan's chain search stops with what it has (PLAN_TIME_LIMIT_S). */
  readonly timeLimitS: number;
  /**
   * Seconds after which a plan still running is ended and stored as failed: a backstop for the stages the soft limit
   * does not reach. @default max(60, 4 × timeLimitS)
   */
  readonly hardLimitS?: number;
  /** Starts of one plan (restarts after a crash included) before it is stored as failed. @default 3 */
  readonly maxAttempts?: number;
  /** One log line per event. */
  readonly log: (level: 'info' | 'warn' | 'error', fields: Record<string, unknown>, message: string) => void;
  /** @default Date.now */
  readonly now?: () => number;
}

type StopReason = 'cancel' | 'shutdown' | 'time';

/**
 * The plan queue. The store is the queue: a posted plan is stored `queued`, and this takes the oldest queued plans
 * into the worker pool, up to `concurrency` at once, storing each result and status in one transaction. Plans left
 * `running` by a crash are queued again at `start`; `drain` lets running plans finish for a grace period and puts the
 * rest back in the queue for the next start.
 */
export class PlanJobs {
  private readonly running = new Map<string, { controller: AbortController; settled: Promise<void> }>();
  private accepting = false;
  private readonly hardLimitMs: number;
  private readonly maxAttempts: number;
  private readonly now: () => number;

  constructor(private readonly options: PlanJobsOptions) {
    this.hardLimitMs = (options.hardLimitS ?? Math.max(60, 4 * options.timeLimitS)) * 1000;
    this.maxAttempts = options.maxAttempts ?? 3;
    this.now = options.now ?? Date.now;
  }

  /** Queues again what a previous process left running, then starts taking plans. */
  start(): void {
    const again = this.options.store.requeueAllRunning();
    if (again.length > 0) this.options.log('info', { plans: again }, 'plans left running are queued again');
    this.accepting = true;
    this.kick();
  }

  /** Takes queued plans while there is room; call after queuing a plan. */
  kick(): void {
    while (this.accepting && this.running.size < this.options.concurrency) {
      const claimed = this.options.store.claimNext(this.iso());
      if (!claimed) return;
      this.launch(claimed);
    }
  }

  /** Plans computing now. */
  get active(): number {
    return this.running.size;
  }

  /** True while the queue takes plans (between `start` and `drain`). */
  get accepts(): boolean {
    return this.accepting;
  }

  /** Ends a running plan (its thread stops); resolves when it has stopped. False when it was not running here. */
  async cancel(id: string): Promise<boolean> {
    const job = this.running.get(id);
    if (!job) return false;
    job.controller.abort('cancel' satisfies StopReason);
    await job.settled;
    return true;
  }

  /**
   * Stops taking plans, lets running ones finish for `graceMs`, then ends the rest and queues them again (they start
   * over at the next start). Resolves when no plan runs.
   */
  async drain(graceMs: number): Promise<{ finished: number; requeued: number }> {
    this.accepting = false;
    const jobs = [...this.running.values()];
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([
      Promise.all(jobs.map((j) => j.settled)),
      new Promise<void>((resolve) => {
        timer = setTimeout(resolve, graceMs);
      }),
    ]);
    clearTimeout(timer);
    const left = [...this.running.values()];
    for (const j of left) j.controller.abort('shutdown' satisfies StopReason);
    await Promise.all(left.map((j) => j.settled));
    return { finished: jobs.length - left.length, requeued: left.length };
  }

  private launch(claimed: ClaimedPlan): void {
    const { entry, schedulePacked, requestFindings } = claimed;
    const { store, pool, log } = this.options;
    const controller = new AbortController();
    const timer = setTimeout(() => controller.abort('time' satisfies StopReason), this.hardLimitMs);
    let last = { t: 0, stage: '' };
    const onProgress = (p: PlanProgress) => {
      // a few stages per plan: write every new stage, and within one stage at most every 100 ms
      const t = this.now();
      if (p.stage === last.stage && t - last.t < 100) return;
      last = { t, stage: p.stage };
      store.setProgress(entry.id, p);
    };
    log('info', { plan: entry.id, attempt: entry.attempts }, 'plan started');
    const task = {
      id: entry.id,
      createdAt: entry.createdAt,
      startedAt: entry.startedAt ?? this.iso(),
      schedulePacked,
      scheduleHash: entry.scheduleHash,
      requestFindings,
      timeLimitS: this.options.timeLimitS,
    };
    const settled = pool
      .plan(task, controller.signal, onProgress)
      .then((done) => {
        if (done.unreadable) log('warn', { plan: entry.id, unreadable: done.unreadable }, 'plan not finite');
        if (done.renderError) {
          log('error', { plan: entry.id, err: done.renderError }, 'plan downloads not rendered; rendered when asked');
        }
        const stored = store.finish(entry.id, done.result, this.iso());
        log(
          'info',
          {
            plan: entry.id,
            status: done.result.status,
            plates: done.plates,
            ms: done.ms,
            downloads: done.result.artifacts?.length ?? 0,
            stored,
          },
          'plan computed',
        );
      })
      .catch((err: unknown) => {
        const reason = controller.signal.aborted ? (controller.signal.reason as StopReason) : null;
        if (reason === 'cancel') return;
        if (reason === 'shutdown') {
          store.requeue(entry.id);
          log('info', { plan: entry.id }, 'plan queued again for the next start');
          return;
        }
        if (reason === null && entry.attempts < this.maxAttempts) {
          log('warn', { plan: entry.id, err, attempt: entry.attempts }, 'plan worker stopped; plan queued again');
          store.requeue(entry.id);
          return;
        }
        const error =
          reason === 'time'
            ? `The plan ran longer than ${this.hardLimitMs / 1000} s and was stopped. Plan fewer stations, or fix the plate count with limits.plate_count.`
            : `The plan stopped its worker ${entry.attempts} times and was given up. Report the plan id to the service owners.`;
        log('error', { plan: entry.id, err, reason }, 'plan failed outside the pipeline');
        const schedule = unpackJson<Schedule>(schedulePacked);
        const record = {
          id: entry.id,
          createdAt: entry.createdAt,
          schedule,
          plan: failedPlan(schedule, requestFindings, error),
        };
        const written = planResult(record, {
          scheduleHash: entry.scheduleHash,
          startedAt: entry.startedAt,
          finishedAt: this.iso(),
        });
        store.finish(entry.id, written.result, this.iso());
      })
      .catch((err: unknown) => log('error', { plan: entry.id, err }, 'plan result could not be stored'))
      .finally(() => {
        clearTimeout(timer);
        this.running.delete(entry.id);
        this.kick();
      });
    this.running.set(entry.id, { controller, settled });
  }

  private iso(): string {
    return new Date(this.now()).toISOString();
  }
}
