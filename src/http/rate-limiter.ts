/**
 * A fixed-window request counter per client: at most `limit` requests per `windowMs`. In memory, one process; enough
 * to keep one runaway line controller from starving the others. The clock is passed in so tests control time.
 */
export class RateLimiter {
  private readonly windows = new Map<string, { start: number; count: number }>();

  constructor(
    private readonly limit: number,
    private readonly windowMs: number,
    private readonly now: () => number,
  ) {}

  /** Counts one request; returns 0 when allowed, else the seconds until the client may try again. */
  take(client: string): number {
    const t = this.now();
    const w = this.windows.get(client);
    if (!w || t - w.start >= this.windowMs) {
      if (this.windows.size > 10_000) this.prune(t);
      this.windows.set(client, { start: t, count: 1 });
      return 0;
    }
    w.count++;
    return w.count <= this.limit ? 0 : Math.max(1, Math.ceil((w.start + this.windowMs - t) / 1000));
  }

  private prune(t: number): void {
    for (const [client, w] of this.windows) if (t - w.start >= this.windowMs) this.windows.delete(client);
  }
}
