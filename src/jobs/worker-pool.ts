import { fileURLToPath } from 'node:url';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { CheckAnswer, IntakeRefusal, PlanIntake } from '../http/schedule-intake.js';
import type { PlanProgress } from '../store/index.js';
import type { RenderedDownload } from '../http/render-download.js';
import type { CheckTask, IntakeTask, PlanTask, PlanTaskResult, RenderTask } from './run-task.js';

/** Sizes of the worker pool. */
export interface WorkerPoolOptions {
  /** Plans computed at once; each holds one thread. */
  readonly planThreads: number;
  /** Threads kept for checks besides the plan threads, so a check never waits behind a long plan. @default 1 */
  readonly checkThreads?: number;
  /** Checks that may wait for a thread; more are refused (503). @default 64 */
  readonly maxCheckQueue?: number;
  /** Downloads that may wait for a thread to render them; more are refused (503). @default 64 */
  readonly maxRenderQueue?: number;
  /** Start every thread at once (the service), or each when first needed (tests, short-lived tools). @default true */
  readonly warm?: boolean;
}

/** Heap limit of one worker thread, MiB (the demo plans in well under 200). */
export const WORKER_HEAP_MB = 2048;

/** Thrown by `check` or `render` when too many tasks of its kind wait already. */
export class PoolBusyError extends Error {
  constructor(what = 'checks') {
    super(`too many ${what} are waiting for a worker`);
  }
}

/**
 * Worker threads (piscina) that run plans and checks off the service thread, so `/healthz` and reads answer while
 * plans compute. Tasks are plain data; a plan reports progress through a message port and stops when its signal is
 * aborted (the thread is ended and replaced).
 */
export class WorkerPool {
  private readonly piscina: Piscina;
  private readonly maxCheckQueue: number;
  private waitingChecks = 0;
  private readonly maxRenderQueue: number;
  private waitingRenders = 0;
  private closed = false;

  constructor(options: WorkerPoolOptions) {
    const threads = options.planThreads + (options.checkThreads ?? 1);
    this.maxCheckQueue = options.maxCheckQueue ?? 64;
    this.maxRenderQueue = options.maxRenderQueue ?? 64;
    this.piscina = new Piscina({
      filename: fileURLToPath(new URL('./worker-entry.mjs', import.meta.url)),
      minThreads: options.warm === false ? 0 : threads,
      maxThreads: threads,
      idleTimeout: 60_000,
      // workers yield the CPU to the service thread (Linux thread niceness, through @napi-rs/nice where present),
      // so /healthz and reads stay fast on a machine whose cores the plans fill
      niceIncrement: 10,
      // a plan that runs away with memory ends its own thread (and is retried, then failed), not the service
      resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB },
    });
  }

  /** Computes a plan in a worker; `onProgress` hears its stages. Rejects when `signal` aborts or the thread dies. */
  async plan(
    task: Omit<PlanTask, 'kind' | 'progress'>,
    signal: AbortSignal,
    onProgress: (p: PlanProgress) => void,
  ): Promise<PlanTaskResult> {
    const channel = new MessageChannel();
    channel.port1.on('message', (m: PlanProgress) => onProgress(m));
    try {
      const full: PlanTask = { ...task, kind: 'plan', progress: channel.port2 };
      return (await this.piscina.run(full, { signal, transferList: [channel.port2] })) as PlanTaskResult;
    } finally {
      channel.port1.close();
    }
  }

  /**
   * Checks a posted schedule in a worker, from the body's bytes to the report's JSON (see `checkBody`), or says why it
   * is refused; `PoolBusyError` when too many checks and intakes wait.
   */
  async check(body: Uint8Array): Promise<IntakeRefusal | CheckAnswer> {
    return (await this.intakeTask({ kind: 'check', body })) as IntakeRefusal | CheckAnswer;
  }

  /**
   * Reads a schedule posted for a plan in a worker, from the body's bytes to what the store queues (see `planBody`),
   * or says why it is refused; `PoolBusyError` when too many checks and intakes wait.
   */
  async takePlan(body: Uint8Array): Promise<IntakeRefusal | PlanIntake> {
    return (await this.intakeTask({ kind: 'intake', body })) as IntakeRefusal | PlanIntake;
  }

  /**
   * Runs a body's intake. A body that owns its memory (the framework's parser gives a large body its own) is moved to
   * the worker, not copied, and is empty here afterwards; a small one shares a pooled block and is copied.
   */
  private async intakeTask(task: CheckTask | IntakeTask): Promise<unknown> {
    if (this.waitingChecks >= this.maxCheckQueue) throw new PoolBusyError();
    this.waitingChecks++;
    try {
      const { buffer, byteOffset, byteLength } = task.body;
      const own = buffer instanceof ArrayBuffer && byteOffset === 0 && byteLength === buffer.byteLength;
      return await this.piscina.run(task, own ? { transferList: [buffer] } : {});
    } finally {
      this.waitingChecks--;
    }
  }

  /**
   * Renders downloads of a finished plan in a worker (the drawing model's clipping and every writer stay off the
   * service thread); `PoolBusyError` when too many renders wait.
   */
  async render(task: Omit<RenderTask, 'kind'>): Promise<RenderedDownload[]> {
    if (this.waitingRenders >= this.maxRenderQueue) throw new PoolBusyError('downloads');
    this.waitingRenders++;
    try {
      const full: RenderTask = { ...task, kind: 'render' };
      return (await this.piscina.run(full)) as RenderedDownload[];
    } finally {
      this.waitingRenders--;
    }
  }

  /** Threads alive now (fewer than the pool's size before they are first needed). */
  get threads(): number {
    return this.piscina.threads.length;
  }

  /** True until `close`. */
  get open(): boolean {
    return !this.closed;
  }

  async close(): Promise<void> {
    this.closed = true;
    await this.piscina.close({ force: true });
  }
}
