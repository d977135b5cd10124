/**
 * Service settings from the environment, resolved once at start-up. Every default is stated here and in the README.
 */
export interface Config {
  /** Interface to listen on. @default "127.0.0.1" (set HOST=0.0.0.0 to serve other machines) */
  readonly host: string;
  /** TCP port. @default 8080 */
  readonly port: number;
  /** pino log level. @default "info" */
  readonly logLevel: string;
  /** Requests per minute allowed from one client address; 0 turns the limit off. @default 600 */
  readonly rateLimitPerMinute: number;
  /**
   * Seconds after which a plan's chain search stops with what it has (plans are computed inside the request until
   * they move to background jobs). @default 20
   */
  readonly planTimeLimitS: number;
}

export function loadConfig(env: Readonly<Record<string, string | undefined>>): Config {
  const port = env.PORT === undefined || env.PORT === '' ? 8080 : Number(env.PORT);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PORT must be a whole number from 0 to 65535, got "${env.PORT}"`);
  }
  const rate =
    env.RATE_LIMIT_PER_MINUTE === undefined || env.RATE_LIMIT_PER_MINUTE === ''
      ? 600
      : Number(env.RATE_LIMIT_PER_MINUTE);
  if (!Number.isInteger(rate) || rate < 0) {
    throw new Error(`RATE_LIMIT_PER_MINUTE must be a whole number, 0 for no limit, got "${env.RATE_LIMIT_PER_MINUTE}"`);
  }
  const limit =
    env.PLAN_TIME_LIMIT_S === undefined || env.PLAN_TIME_LIMIT_S === '' ? 20 : Number(env.PLAN_TIME_LIMIT_S);
  if (!(Number.isFinite(limit) && limit > 0)) {
    throw new Error(`PLAN_TIME_LIMIT_S must be a number of seconds above 0, got "${env.PLAN_TIME_LIMIT_S}"`);
  }
  return {
    host: env.HOST || '127.0.0.1',
    port,
    logLevel: env.LOG_LEVEL || 'info',
    rateLimitPerMinute: rate,
    planTimeLimitS: limit,
  };
}
