import { createHash } from 'node:crypto';
import type { PlanEntry } from '../store/index.js';
import { SERVICE_VERSION } from '../version.js';

/**
 * Strong ETag of a finished plan's resource: the plan's hash, the service version and the resource (path suffix and
 * query), so a download changes its tag exactly when its bytes could change.
 */
export function planEtag(entry: PlanEntry, resource: string): string | null {
  if (entry.planHash === null) return null;
  let salt = salts.get(resource);
  if (salt === undefined) {
    salt = createHash('sha256').update(`${SERVICE_VERSION}\n${resource}`).digest('hex').slice(0, 12);
    // the same few resources are asked for again and again: keep their salts (bounded, oldest dropped)
    salts.set(resource, salt);
    if (salts.size > SALTS_KEPT) salts.delete(salts.keys().next().value!);
  }
  return `"${entry.planHash.slice(0, 32)}-${salt}"`;
}

/** Resource salts kept, so a tag costs no hash per request. */
const SALTS_KEPT = 1024;
const salts = new Map<string, string>();

/** True when an If-None-Match header names `etag` (or is `*`); weak tags compare by their opaque part. */
export function matchesEtag(ifNoneMatch: string | string[] | undefined, etag: string): boolean {
  if (ifNoneMatch === undefined) return false;
  const text = Array.isArray(ifNoneMatch) ? ifNoneMatch.join(',') : ifNoneMatch;
  return text.split(',').some((t) => {
    const tag = t.trim().replace(/^W\//, '');
    return tag === '*' || tag === etag;
  });
}
