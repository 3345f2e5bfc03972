import pino from 'pino';
import type { Config } from './config';

export type Logger = pino.Logger;

/** One structured logger per process; secrets in headers never reach the log. */
export function createLogger(config: Pick<Config, 'logLevel'>): Logger {
  return pino({
    level: config.logLevel,
    base: { app: 'dipdeck' },
    redact: {
      paths: [
        'req.headers.cookie',
        'req.headers.authorization',
        'req.headers["x-csrf-token"]',
        'res.headers["set-cookie"]',
      ],
      censor: '[redacted]',
    },
  });
}
