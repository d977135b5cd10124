import { availableParallelism } from 'node:os';

/** An API token: who holds it (its name, logged), what it may do, and the secret itself (never logged). */
export interface ApiToken {
  readonly name: string;
  /** `read`: GET routes; `write`: also POST and DELETE. */
  readonly scope: 'read' | 'write';
  readonly token: string;
}

/**
 * Service settings from the environment, resolved once at start-up. Every default is stated here and in the README.
 */
export interface Config {
  /**
   * Interface to listen on. @default "127.0.0.1" (set HOST=0.0.0.0 to serve other machines; only with API_TOKENS:
   * without tokens the service listens on loopback whatever HOST says, see `hostIgnored`)
   */
  readonly host: string;
  /** The HOST asked for and not used because no API token is configured; null otherwise. */
  readonly hostIgnored: string | null;
  /** TCP port. @default 8080 */
  readonly port: number;
  /** pino log level. @default "info" */
  readonly logLevel: string;
  /** Requests per minute allowed from one client (token, or address without tokens); 0 turns the limit off. @default 600 */
  readonly rateLimitPerMinute: number;
  /** Seconds after which a plan's chain search stops with what it has. @default 20 */
  readonly planTimeLimitS: number;
  /** SQLite file of the plan store (DATABASE_PATH). @default "./data/plans.sqlite" */
  readonly databasePath: string;
  /** Plans computed at once, each in its own worker thread (PLAN_WORKERS). @default cores − 1, at least 1 */
  readonly planWorkers: number;
  /** Seconds a shutdown waits for running plans before queuing them again (SHUTDOWN_GRACE_S). @default 3 */
  readonly shutdownGraceS: number;
  /** API_TOKENS="name:scope:token,…"; empty: no authentication (and loopback only). @default none */
  readonly apiTokens: readonly ApiToken[];
}

const LOOPBACK = new Set(['127.0.0.1', '::1', 'localhost']);

export function loadConfig(env: Readonly<Record<string, string | undefined>>): Config {
  const given = (name: string) => env[name] !== undefined && env[name] !== '';
  const port = given('PORT') ? Number(env.PORT) : 8080;
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PORT must be a whole number from 0 to 65535, got "${env.PORT}"`);
  }
  const rate = given('RATE_LIMIT_PER_MINUTE') ? Number(env.RATE_LIMIT_PER_MINUTE) : 600;
  if (!Number.isInteger(rate) || rate < 0) {
    throw new Error(`RATE_LIMIT_PER_MINUTE must be a whole number, 0 for no limit, got "${env.RATE_LIMIT_PER_MINUTE}"`);
  }
  const limit = given('PLAN_TIME_LIMIT_S') ? Number(env.PLAN_TIME_LIMIT_S) : 20;
  if (!(Number.isFinite(limit) && limit > 0)) {
    throw new Error(`PLAN_TIME_LIMIT_S must be a number of seconds above 0, got "${env.PLAN_TIME_LIMIT_S}"`);
  }
  const workers = given('PLAN_WORKERS') ? Number(env.PLAN_WORKERS) : Math.max(1, availableParallelism() - 1);
  if (!Number.isInteger(workers) || workers < 1 || workers > 64) {
    throw new Error(`PLAN_WORKERS must be a whole number from 1 to 64, got "${env.PLAN_WORKERS}"`);
  }
  const grace = given('SHUTDOWN_GRACE_S') ? Number(env.SHUTDOWN_GRACE_S) : 3;
  if (!(Number.isFinite(grace) && grace >= 0 && grace <= 600)) {
    throw new Error(`SHUTDOWN_GRACE_S must be a number of seconds from 0 to 600, got "${env.SHUTDOWN_GRACE_S}"`);
  }
  const apiTokens = parseApiTokens(env.API_TOKENS ?? '');
  const asked = env.HOST || '127.0.0.1';
  const open = apiTokens.length === 0 && !LOOPBACK.has(asked);
  return {
    host: open ? '127.0.0.1' : asked,
    hostIgnored: open ? asked : null,
    port,
    logLevel: env.LOG_LEVEL || 'info',
    rateLimitPerMinute: rate,
    planTimeLimitS: limit,
    databasePath: env.DATABASE_PATH || './data/plans.sqlite',
    planWorkers: workers,
    shutdownGraceS: grace,
    apiTokens,
  };
}

/**
 * `name:scope:token,…` → tokens. Names are letters, digits, `.`, `_`, `-`; scope `read` or `write`; a token at least
 * 16 characters without `,` or spaces. Errors name the entry by position and name, never the secret.
 */
export function parseApiTokens(text: string): ApiToken[] {
  const tokens: ApiToken[] = [];
  const entries = text
    .split(',')
    .map((e) => e.trim())
    .filter((e) => e !== '');
  entries.forEach((entry, i) => {
    const first = entry.indexOf(':');
    const second = entry.indexOf(':', first + 1);
    const name = first > 0 ? entry.slice(0, first) : '';
    const scope = second > first ? entry.slice(first + 1, second) : '';
    const token = second > 0 ? entry.slice(second + 1) : '';
    const where = `API_TOKENS entry ${i + 1}${/^[\w.-]{1,64}$/.test(name) ? ` ("${name}")` : ''}`;
    if (!/^[\w.-]{1,64}$/.test(name))
      throw new Error(`${where}: write it as name:scope:token (name of letters, digits, . _ -)`);
    if (scope !== 'read' && scope !== 'write') throw new Error(`${where}: the scope must be read or write`);
    if (token.length < 16 || /\s/.test(token))
      throw new Error(`${where}: the token must be at least 16 characters, no spaces`);
    if (tokens.some((t) => t.name === name)) throw new Error(`${where}: the name is used twice`);
    tokens.push({ name, scope, token });
  });
  return tokens;
}
