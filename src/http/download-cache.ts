/** One download as sent: its body and the headers that describe it. */
export interface CachedDownload {
  readonly body: string | Buffer;
  readonly headers: Readonly<Record<string, string>>;
}

/**
 * Downloads of finished plans as sent, most recently used kept, bounded by count and bytes. Safe because a finished
 * plan never changes and the same plan gives byte-identical files; keyed by the download's ETag, which names the
 * plan's hash, the service version and the resource. A deleted plan's entries are dropped.
 */
export class DownloadCache {
  private readonly entries = new Map<string, { plan: string; download: CachedDownload; bytes: number }>();
  private bytes = 0;

  constructor(
    private readonly maxEntries = 256,
    private readonly maxBytes = 64 * 1024 * 1024,
  ) {}

  get(etag: string): CachedDownload | undefined {
    const hit = this.entries.get(etag);
    if (!hit) return undefined;
    this.entries.delete(etag);
    this.entries.set(etag, hit);
    return hit.download;
  }

  set(etag: string, plan: string, download: CachedDownload): void {
    const bytes = Buffer.byteLength(download.body);
    if (bytes > this.maxBytes / 8) return;
    this.drop(etag);
    this.entries.set(etag, { plan, download, bytes });
    this.bytes += bytes;
    while (this.entries.size > this.maxEntries || this.bytes > this.maxBytes) {
      this.drop(this.entries.keys().next().value!);
    }
  }

  /** Forgets every download of a plan. */
  forget(plan: string): void {
    for (const [etag, e] of this.entries) if (e.plan === plan) this.drop(etag);
  }

  private drop(etag: string): void {
    const e = this.entries.get(etag);
    if (!e) return;
    this.entries.delete(etag);
    this.bytes -= e.bytes;
  }
}
