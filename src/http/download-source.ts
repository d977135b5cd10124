import { PoolBusyError, type WorkerPool } from '../jobs/index.js';
import type { PlanStore, StoredArtifact } from '../store/index.js';
import { type CachedDownload, DownloadCache } from './download-cache.js';
import { ERROR_CATALOGUE, type ErrorCode, errorBody } from './error-catalogue.js';
import { isDefaultDownload } from './render-download.js';
import { sendBusy } from './worker-replies.js';

/**
 * Where a finished plan's downloads come from, in order: memory (the downloads sent last), the store (rendered by the
 * plan's worker when the plan finished, written with its result), and else a worker of the pool, which renders the
 * download from the stored plan (a query other than the default, or a plan stored before its downloads were
 * rendered with it; such a plan's default downloads are then stored). Nothing is rendered on the service thread; a
 * download asked for by several requests at once is rendered once.
 */
export class DownloadSource {
  private readonly memory = new DownloadCache();
  private readonly rendering = new Map<string, Promise<CachedDownload>>();

  constructor(
    private readonly store: PlanStore,
    private readonly pool: WorkerPool,
  ) {}

  /** The download `name` of finished plan `id` (a file or a refusal); rejects with `PoolBusyError` when overloaded. */
  async get(id: string, name: string): Promise<CachedDownload> {
    const known = this.memory.get(id, name);
    if (known) return known;
    const stored = this.store.artifact(id, name);
    if (stored) return this.remember(id, name, stored);
    const names = this.store.artifactNames(id);
    if (names.length > 0 && name.startsWith('plates/') && isDefaultDownload(name)) {
      // a part the plan does not have: the plan's own reason when it has no drawings, else its parts
      const sheet = this.store.artifact(id, 'plates.dxf');
      if (sheet?.refusal) return this.remember(id, name, sheet);
      const part = decodeURIComponent(name.slice('plates/'.length).replace(/\.dxf(\?.*)?$/, ''));
      const parts = names
        .filter((n) => /^plates\/[^?]+\.dxf$/.test(n))
        .map((n) => decodeURIComponent(n.slice('plates/'.length, -'.dxf'.length)));
      const message = `Plan ${id} has no part ${part.slice(0, 40)}; its parts are ${parts.join(', ')}.`;
      return this.remember(id, name, {
        name,
        refusal: 'not_found',
        contentType: 'application/json; charset=utf-8',
        disposition: '',
        cautions: sheet?.cautions ?? '',
        body: Buffer.from(message),
      });
    }
    // a plan stored before its downloads were rendered with it renders them all at once, and keeps them
    const backfill = names.length === 0 && isDefaultDownload(name);
    const key = backfill ? `${id}|*` : `${id}|${name}`;
    let pending = this.rendering.get(key);
    if (!pending) {
      pending = this.render(id, backfill ? undefined : [name]).finally(() => this.rendering.delete(key));
      this.rendering.set(key, pending);
    }
    await pending;
    return this.memory.get(id, name) ?? (await this.render(id, [name]));
  }

  /** Forgets a deleted plan's downloads. */
  forget(id: string): void {
    this.memory.forget(id);
  }

  /** Renders downloads in a worker and keeps them; resolves with the first. */
  private async render(id: string, names: readonly string[] | undefined): Promise<CachedDownload> {
    const text = this.store.resultText(id);
    if (!text) {
      // deleted while the request was on its way
      return {
        body: Buffer.from(`No plan with id ${id}.`),
        headers: { 'content-type': 'application/json; charset=utf-8' },
        refusal: 'not_found',
      };
    }
    const rendered = await this.pool.render({ id, ...text, ...(names ? { names } : {}) });
    const artifacts: StoredArtifact[] = rendered.map((r) => ({ ...r, body: asBuffer(r.body) }));
    if (names === undefined) this.store.addArtifacts(id, artifacts);
    let first: CachedDownload | undefined;
    for (const a of artifacts) {
      const made = this.remember(id, a.name, a);
      first ??= made;
    }
    if (!first) throw new Error(`plan ${id}: nothing rendered`);
    return first;
  }

  private remember(id: string, name: string, a: StoredArtifact): CachedDownload {
    const headers: Record<string, string> = { 'content-type': a.contentType };
    if (a.disposition !== '') headers['content-disposition'] = a.disposition;
    if (a.cautions !== '') headers['x-cautions'] = a.cautions;
    const download: CachedDownload = { body: asBuffer(a.body), headers, refusal: a.refusal };
    this.memory.set(id, name, download);
    return download;
  }
}

/** A Buffer over the same bytes (a worker's Uint8Array arrives without Buffer's prototype). */
function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/** The part of a reply `sendDownload` uses. */
interface DownloadReply {
  code(status: number): this;
  headers(values: Record<string, string>): this;
  header(name: string, value: string): this;
  send(body: unknown): this;
}

/**
 * Sends a download: the file with its headers, or its refusal as the catalogue's error body (with the plan's
 * cautions named in X-Cautions all the same); 503 `service_busy` when the workers have too many downloads waiting.
 */
export async function sendDownload<R extends DownloadReply>(
  source: DownloadSource,
  reply: R,
  requestId: string,
  id: string,
  name: string,
): Promise<R> {
  let download: CachedDownload;
  try {
    download = await source.get(id, name);
  } catch (err) {
    if (!(err instanceof PoolBusyError)) throw err;
    return sendBusy(reply, requestId, 'downloads');
  }
  if (download.refusal === null) return reply.headers(download.headers).send(download.body);
  const code = download.refusal as ErrorCode;
  const cautions = download.headers['x-cautions'];
  if (cautions !== undefined) reply.header('x-cautions', cautions);
  return reply
    .code(ERROR_CATALOGUE[code].status)
    .send({ ...errorBody(code, download.body.toString('utf8')), request_id: requestId });
}
