import { buildApp } from './app.js';
import { loadConfig } from './config.js';
import { createLogger } from './logger.js';
import { SqlitePlanStore } from './store/index.js';

let config: ReturnType<typeof loadConfig>;
try {
  config = loadConfig(process.env);
} catch (err) {
  console.error(`die-motion-planner: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(2);
}
const logger = createLogger(config.logLevel);
let store: SqlitePlanStore;
try {
  store = new SqlitePlanStore(config.databasePath);
} catch (err) {
  logger.fatal(
    { database: config.databasePath, reason: err instanceof Error ? err.message : String(err) },
    'cannot open the plan store: check DATABASE_PATH and that its directory is writable',
  );
  process.exit(1);
}
const app = await buildApp({
  logger,
  store,
  rateLimitPerMinute: config.rateLimitPerMinute,
  planTimeLimitS: config.planTimeLimitS,
  planWorkers: config.planWorkers,
  shutdownGraceMs: config.shutdownGraceS * 1000,
  apiTokens: config.apiTokens,
});
try {
  await app.listen({ host: config.host, port: config.port });
} catch (err) {
  logger.fatal({ err }, 'could not start the service');
  store.close();
  process.exit(1);
}
if (config.apiTokens.length === 0) {
  logger.warn(
    { host: config.host, ignoredHost: config.hostIgnored },
    config.hostIgnored
      ? `no API_TOKENS: every route is open, so the service listens on loopback only (${config.host}), not on HOST=${config.hostIgnored}`
      : `no API_TOKENS: every route is open; listening on loopback only (${config.host})`,
  );
} else {
  logger.info({ tokens: config.apiTokens.map((t) => `${t.name}:${t.scope}`) }, 'API tokens required on /v1 routes');
}
logger.info(
  { database: config.databasePath, planWorkers: config.planWorkers, planTimeLimitS: config.planTimeLimitS },
  'plan store and workers ready',
);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal, graceS: config.shutdownGraceS }, 'shutting down: running plans finish or are queued again');
    // a hard stop in case closing hangs: queued plans are safe in the store either way
    setTimeout(() => process.exit(1), (config.shutdownGraceS + 10) * 1000).unref();
    void app
      .close()
      .then(() => {
        store.close();
        logger.info('stopped');
        process.exit(0);
      })
      .catch((err: unknown) => {
        logger.error({ err }, 'shutdown failed');
        process.exit(1);
      });
  });
}
