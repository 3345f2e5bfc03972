import path from 'node:path';
import { z } from 'zod';

// The one reader of process.env: the server, the worker and the scripts all take their settings from here.
const booleanFlag = z
  .enum(['0', '1', 'true', 'false'])
  .transform((value) => value === '1' || value === 'true');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65_535).default(3000),
  DATA_DIR: z.string().min(1).default('./data'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// or postgresql:// URL')
    .optional(),
  REDIS_URL: z
    .string()
    .regex(/^rediss?:\/\//, 'REDIS_URL must be a redis:// or rediss:// URL')
    .optional(),
  SMTP_URL: z
    .string()
    .regex(/^smtps?:\/\//, 'SMTP_URL must be an smtp:// or smtps:// URL')
    .optional(),
  QUEUE_PREFIX: z
    .string()
    .regex(/^[a-z0-9-]{1,40}$/, 'QUEUE_PREFIX is 1–40 lowercase letters, digits or dashes')
    .default('dipdeck'),
  MAIL_RATE_PER_S: z.coerce.number().min(0.1).max(1_000).default(10),
  MAIL_FROM: z.string().trim().min(3).max(320).default('Dipdeck <dipdeck@localhost>'),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  PUBLIC_URL: z.url().optional(),
  DIPDECK_DEMO: booleanFlag.default(true),
  DIPDECK_DEMO_TARGETS: z.coerce.number().int().min(1).max(5_000).default(240),
  TRUST_PROXY: booleanFlag.default(false),
  SESSION_IDLE_HOURS: z.coerce
    .number()
    .positive()
    .max(24 * 30)
    .default(72),
  SESSION_ABSOLUTE_DAYS: z.coerce.number().positive().max(365).default(30),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  SQLITE_BUSY_TIMEOUT_MS: z.coerce.number().int().min(0).max(600_000).default(5_000),
});

export type Environment = z.input<typeof envSchema>;

export interface Config {
  nodeEnv: 'development' | 'test' | 'production';
  isProduction: boolean;
  port: number;
  dataDir: string;
  sqliteFile: string;
  databaseUrl: string | undefined;
  redisUrl: string | undefined;
  smtpUrl: string | undefined;
  /** The From of every mail Dipdeck sends. */
  mailFrom: string;
  /** Newsletter messages per second at most. */
  mailRatePerSecond: number;
  /** Key prefix of the queues in Redis: processes with the same prefix share the work. */
  queuePrefix: string;
  sessionSecret: string | undefined;
  publicUrl: string;
  demo: boolean;
  /** How many invented targets the demo campaign gets. */
  demoTargets: number;
  trustProxy: boolean;
  sessionIdleMs: number;
  sessionAbsoluteMs: number;
  logLevel: string;
  /** How long a SQLite write waits for another connection's write lock before it gives up (503). */
  sqliteBusyTimeoutMs: number;
}

export class ConfigError extends Error {
  override name = 'ConfigError';
}

/** Parses the environment once at start-up; a wrong value stops the process with every problem named. */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const defined = Object.fromEntries(
    Object.entries(env).filter(([, value]) => value !== undefined && value !== ''),
  );
  const parsed = envSchema.safeParse(defined);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new ConfigError(`Invalid configuration:\n  ${problems.join('\n  ')}`);
  }
  const e = parsed.data;
  const dataDir = path.resolve(e.DATA_DIR);
  return {
    nodeEnv: e.NODE_ENV,
    isProduction: e.NODE_ENV === 'production',
    port: e.PORT,
    dataDir,
    sqliteFile: path.join(dataDir, 'dipdeck.sqlite'),
    databaseUrl: e.DATABASE_URL,
    redisUrl: e.REDIS_URL,
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    mailRatePerSecond: e.MAIL_RATE_PER_S,
    queuePrefix: e.QUEUE_PREFIX,
    sessionSecret: e.SESSION_SECRET,
    publicUrl: (e.PUBLIC_URL ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    demo: e.DIPDECK_DEMO,
    demoTargets: e.DIPDECK_DEMO_TARGETS,
    trustProxy: e.TRUST_PROXY,
    sessionIdleMs: e.SESSION_IDLE_HOURS * 3_600_000,
    sessionAbsoluteMs: e.SESSION_ABSOLUTE_DAYS * 86_400_000,
    logLevel: e.LOG_LEVEL ?? (e.NODE_ENV === 'test' ? 'silent' : 'info'),
    sqliteBusyTimeoutMs: e.SQLITE_BUSY_TIMEOUT_MS,
  };
}
