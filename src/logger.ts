import { type DestinationStream, type Logger, pino } from 'pino';

/**
 * The service's logger: JSON lines with string levels. Authorization headers and anything named `token` are
 * redacted wherever they appear, so an API token never reaches a log.
 */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = {
    level,
    formatters: { level: (label: string) => ({ level: label }) },
    redact: {
      paths: [
        'req.headers.authorization',
        'headers.authorization',
        'authorization',
        'token',
        '*.token',
        'tokens[*].token',
      ],
      censor: '[redacted]',
    },
  };
  return destination ? pino(options, destination) : pino(options);
}
