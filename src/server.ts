import { pino } from 'pino';
import { buildApp } from './app.js';
import { loadConfig } from './config.js';

const config = loadConfig(process.env);
const logger = pino({
  level: config.logLevel,
  formatters: { level: (label) => ({ level: label }) },
  redact: ['req.headers.authorization'],
});
const app = await buildApp({
  logger,
  rateLimitPerMinute: config.rateLimitPerMinute,
  planTimeLimitS: config.planTimeLimitS,
});
try {
  await app.listen({ host: config.host, port: config.port });
} catch (err) {
  logger.fatal({ err }, 'could not start the service');
  process.exit(1);
}
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    logger.info({ signal }, 'shutting down');
    void app.close().then(() => process.exit(0));
  });
}
