import { createHash, timingSafeEqual } from 'node:crypto';
import type { ApiToken } from '../config.js';

/** Who presented a token: its name and scope. */
export interface Principal {
  readonly name: string;
  readonly scope: 'read' | 'write';
}

/**
 * Checks `Authorization: Bearer <token>` against the configured tokens in constant time: every token is compared
 * (SHA-256 digests of equal length, `timingSafeEqual`), so the time taken tells nothing about which one or how much
 * of it matched.
 */
export class ApiTokens {
  private readonly digests: readonly { readonly principal: Principal; readonly digest: Buffer }[];

  constructor(tokens: readonly ApiToken[]) {
    this.digests = tokens.map((t) => ({ principal: { name: t.name, scope: t.scope }, digest: sha256(t.token) }));
  }

  /** True when tokens are configured (every /v1 route then needs one). */
  get required(): boolean {
    return this.digests.length > 0;
  }

  /** The principal of an Authorization header, or null when it carries no known bearer token. */
  identify(header: string | undefined): Principal | null {
    if (header === undefined) return null;
    const match = /^Bearer[ \t]+(\S{1,512})[ \t]*$/i.exec(header);
    if (!match) return null;
    const presented = sha256(match[1]!);
    let found: Principal | null = null;
    for (const d of this.digests) if (timingSafeEqual(d.digest, presented) && found === null) found = d.principal;
    return found;
  }
}

function sha256(text: string): Buffer {
  return createHash('sha256').update(text, 'utf8').digest();
}
