import type { Schedule } from '../domain/index.js';
import type { Plan } from '../pipeline/index.js';

/** One stored plan: the validated schedule it came from and the plan itself. */
export interface PlanRecord {
  readonly id: string;
  /** ISO 8601 time of creation. */
  readonly createdAt: string;
  readonly schedule: Schedule;
  readonly plan: Plan;
}

/** Where plans are kept. Writes are whole records: a plan is stored complete or not at all. */
export interface PlanStore {
  put(record: PlanRecord): void;
  get(id: string): PlanRecord | undefined;
}

/**
 * Plans in process memory, oldest dropped past `capacity`. The embedded default until the job machinery brings a
 * persistent store; plans do not survive a restart.
 */
export class MemoryPlanStore implements PlanStore {
  private readonly records = new Map<string, PlanRecord>();

  constructor(private readonly capacity = 200) {}

  put(record: PlanRecord): void {
    this.records.set(record.id, record);
    while (this.records.size > this.capacity) {
      const oldest = this.records.keys().next().value;
      if (oldest === undefined) break;
      this.records.delete(oldest);
    }
  }

  get(id: string): PlanRecord | undefined {
    return this.records.get(id);
  }
}
