/** One download as sent: its body and the headers that describe it, or a refusal (error code and message). */
export interface CachedDownload {
  readonly body: Buffer;
  readonly headers: Readonly<Record<string, string>>;
  /** The error code when the plan has no such file (the body is then the message); null for a file. */
  readonly refusal: string | null;
}

/**
 * Downloads of finished plans as sent, most recently used kept, bounded by count and bytes. Safe because a finished
 * plan never changes and the same plan gives byte-identical files; keyed by plan id and the download's canonical
 * name. A deleted plan's entries are dropped.
 */
export class DownloadCache {
  private readonly entries = new Map<string, { plan: string; download: CachedDownload; bytes: number }>();
  private bytes = 0;

  constructor(
    private readonly maxEntries = 512,
    private readonly maxBytes = 64 * 1024 * 1024,
  ) {}

  get(plan: string, name: string): CachedDownload | undefined {
    const key = `${plan}|${name}`;
    const hit = this.entries.get(key);
    if (!hit) return undefined;
    this.entries.delete(key);
    this.entries.set(key, hit);
    return hit.download;
  }

  set(plan: string, name: string, download: CachedDownload): void {
    const bytes = download.body.byteLength;
    if (bytes > this.maxBytes / 8) return;
    const key = `${plan}|${name}`;
    this.drop(key);
    this.entries.set(key, { plan, download, bytes });
    this.bytes += bytes;
    while (this.entries.size > this.maxEntries || this.bytes > this.maxBytes) {
      this.drop(this.entries.keys().next().value!);
    }
  }

  /** Forgets every download of a plan. */
  forget(plan: string): void {
    for (const [key, e] of this.entries) if (e.plan === plan) this.drop(key);
  }

  private drop(key: string): void {
    const e = this.entries.get(key);
    if (!e) return;
    this.entries.delete(key);
    this.bytes -= e.bytes;
  }
}
