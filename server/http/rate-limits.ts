import { createHash } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, type Options, rateLimit, type Store } from 'express-rate-limit';
import type { Redis } from 'ioredis';
import { type RedisReply, RedisStore } from 'rate-limit-redis';
import { AppError } from '../errors';
import type { Logger } from '../logger';

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;

/**
 * The abuse limits. The numbers are our own choices, made so that a person who mistypes, a class
 * behind one school address and a script that reads the API all pass, while guessing passwords or
 * tokens, mass sign-ups and mail bombing through the reset form do not. NIST SP 800-63B §5.2.2 asks
 * for at most 100 failed attempts on one account; we allow 50 an hour.
 */
export const RATE_LIMITS = {
  /** Failed sign-ins for one address from one IP: a person who mistypes. */
  signInPerAddressAndIp: { windowMs: 15 * MINUTE, limit: 10 },
  /** Failed sign-ins for one address from anywhere: guessing spread over many IPs. */
  signInPerAddress: { windowMs: HOUR, limit: 50 },
  /** Failed sign-ins from one IP, whatever the address: trying one password on many accounts. */
  signInPerIp: { windowMs: 15 * MINUTE, limit: 100 },
  /** Accounts made from one IP. */
  signUpPerIp: { windowMs: HOUR, limit: 20 },
  /** Reset links asked for one address (whether it has an account or not: the answer tells nothing). */
  passwordResetPerAddress: { windowMs: HOUR, limit: 3 },
  passwordResetPerIp: { windowMs: HOUR, limit: 20 },
  /** Refused reset and confirmation tokens from one IP. */
  emailTokenFailuresPerIp: { windowMs: HOUR, limit: 30 },
  /** Confirmation mails one person asks for again. */
  confirmationResendPerPerson: { windowMs: HOUR, limit: 5 },
  /** Requests made with one API token: 20 a second on average. */
  tokenUsePerToken: { windowMs: MINUTE, limit: 1_200 },
  /** Refused API tokens from one IP. */
  tokenFailuresPerIp: { windowMs: 15 * MINUTE, limit: 30 },
} as const satisfies Record<string, { windowMs: number; limit: number }>;

export type RateLimitName = keyof typeof RATE_LIMITS;
export type RateLimits = Record<RateLimitName, RequestHandler>;

export interface RateLimitOptions {
  logger: Logger;
  /** Counts kept in Redis, so that they hold across server processes; in this process's memory without. */
  redis?: Redis;
  /** Key prefix in Redis (the queue prefix: processes with the same prefix share the counts). */
  prefix: string;
  /** Other numbers for some limits (tests use small ones). */
  overrides?: Partial<Record<RateLimitName, { windowMs: number; limit: number }>>;
}

const ip = (req: Request): string => ipKeyGenerator(req.ip ?? 'unknown');

/** An address as counted and logged: hashed, so that neither the counts in Redis nor the log hold it. */
export const hashedAddress = (email: string): string =>
  createHash('sha256').update(email.trim().toLowerCase()).digest('base64url').slice(0, 22);

const address = (req: Request): string => {
  const value = (req.body as { email?: unknown } | undefined)?.email;
  return hashedAddress(typeof value === 'string' ? value : '');
};

const bearerSecret = (req: Request): string | undefined => {
  const header = req.headers.authorization;
  if (!header || !/^Bearer\s/i.test(header)) return undefined;
  return header.replace(/^Bearer\s+/i, '').trim();
};

const notRefused = (_req: Request, res: Response) => res.statusCode < 400;
const notUnauthenticated = (_req: Request, res: Response) => res.statusCode !== 401;
// A refused token is a 400 (malformed, unknown) or 404 (used, expired) on the e-mail-token routes.
const tokenNotRefused = (_req: Request, res: Response) => res.statusCode !== 400 && res.statusCode !== 404;

interface Rule {
  key: (req: Request) => string;
  /** Count only the requests this refuses (failed attempts); every request when absent. */
  countOnlyWhen?: 'refused' | 'unauthenticated' | 'token-refused';
  skip?: (req: Request) => boolean;
}

const RULES: Record<RateLimitName, Rule> = {
  signInPerAddressAndIp: { key: (req) => `${address(req)}|${ip(req)}`, countOnlyWhen: 'refused' },
  signInPerAddress: { key: address, countOnlyWhen: 'refused' },
  signInPerIp: { key: ip, countOnlyWhen: 'refused' },
  signUpPerIp: { key: ip },
  passwordResetPerAddress: { key: address },
  passwordResetPerIp: { key: ip },
  emailTokenFailuresPerIp: { key: ip, countOnlyWhen: 'token-refused' },
  confirmationResendPerPerson: { key: (req) => String(req.user?.id ?? ip(req)) },
  tokenUsePerToken: {
    key: (req) => createHash('sha256').update(bearerSecret(req)!).digest('base64url').slice(0, 22),
    skip: (req) => !bearerSecret(req),
  },
  tokenFailuresPerIp: {
    key: ip,
    countOnlyWhen: 'unauthenticated',
    skip: (req) => !bearerSecret(req),
  },
};

const SUCCESS: Record<NonNullable<Rule['countOnlyWhen']>, Options['requestWasSuccessful']> = {
  refused: notRefused,
  unauthenticated: notUnauthenticated,
  'token-refused': tokenNotRefused,
};

function store(options: RateLimitOptions, name: RateLimitName): Store | undefined {
  const client = options.redis;
  if (!client) return undefined; // express-rate-limit's memory store
  const redisStore = new RedisStore({
    prefix: `${options.prefix}:rate:${name}:`,
    sendCommand: (command: string, ...args: string[]) => client.call(command, ...args) as Promise<RedisReply>,
  });
  // The store loads its scripts at once and keeps the promises; with Redis unreachable at that moment
  // nothing would handle their rejection and Node would end the process. Each use awaits them again
  // (and reloads the script on failure), so marking them handled loses no error.
  for (const loading of [redisStore.incrementScriptSha, redisStore.getScriptSha]) {
    loading.catch(() => {});
  }
  return redisStore;
}

function tryAgainIn(req: Request, windowMs: number): string {
  const resetAt = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime?.getTime();
  const ms = resetAt === undefined ? windowMs : resetAt - Date.now();
  const minutes = Math.max(1, Math.ceil(ms / MINUTE));
  return minutes === 1 ? 'a minute' : `${minutes} minutes`;
}

export function createRateLimits(options: RateLimitOptions): RateLimits {
  const entries = (Object.keys(RATE_LIMITS) as RateLimitName[]).map((name) => {
    const { windowMs, limit } = options.overrides?.[name] ?? RATE_LIMITS[name];
    const rule = RULES[name];
    const handler = rateLimit({
      windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      identifier: name,
      keyGenerator: rule.key,
      skip: rule.skip,
      store: store(options, name),
      ...(rule.countOnlyWhen
        ? { skipSuccessfulRequests: true, requestWasSuccessful: SUCCESS[rule.countOnlyWhen] }
        : {}),
      // When Redis cannot be reached the limit is not applied, rather than every sign-in refused.
      passOnStoreError: true,
      logger: {
        error: (error, message) => options.logger.error({ err: error, limit: name }, message ?? 'rate limit'),
        warn: (error, message) => options.logger.warn({ err: error, limit: name }, message ?? 'rate limit'),
      },
      handler: (req, _res, next) => {
        options.logger.warn(
          { event: 'rate_limited', limit: name, ip: req.ip, method: req.method, path: req.path },
          'rate limit reached',
        );
        next(
          new AppError(
            'rate_limited',
            `Too many attempts; try again in ${tryAgainIn(req, windowMs)}`,
            'rate_limited',
          ),
        );
      },
    });
    return [name, handler] as const;
  });
  return Object.fromEntries(entries) as unknown as RateLimits;
}
