// Rate limits (CONTRACT §3), kept in PostgreSQL so every app instance on one database shares them:
// rate-limiter-flexible's PostgreSQL store on the app's Sequelize connection pool, one table
// (`rate_limits`, created by a migration), one key prefix per limit. Over a limit: 429 `rate_limited`
// with Retry-After (lib/errors rateLimited). `DENUDATA_RATE_LIMITS=off` turns them off for test runs
// that need it; the tests of the limits themselves run with them on.
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import type { Sequelize } from 'sequelize';
import { getSequelize } from '@/lib/db/sequelize';
import { describeWait, rateLimited } from '@/lib/errors';
import { PEER_HEADER, isTrustedProxy, normaliseAddress } from '@/lib/http/peer';

const MINUTE = 60;
const HOUR = 60 * MINUTE;

/** The limits of CONTRACT §3: `points` events per `duration` seconds per key. */
export const RATE_LIMITS = {
  signInAccount: { points: 10, duration: 15 * MINUTE, what: 'Too many failed sign-ins for this account' },
  signInAddress: { points: 50, duration: 15 * MINUTE, what: 'Too many failed sign-ins from this address' },
  signUpAddress: { points: 10, duration: HOUR, what: 'Too many sign-ups from this address' },
  resetEmail: { points: 5, duration: HOUR, what: 'Too many password-reset requests for this address' },
  resetAddress: { points: 20, duration: HOUR, what: 'Too many password-reset requests from this address' },
  invitationTeam: { points: 50, duration: 24 * HOUR, what: 'Too many invitations from this team today' },
  evaluationUser: { points: 120, duration: MINUTE, what: 'Too many evaluations and quick calculations' },
} as const;

export type RateLimitName = keyof typeof RATE_LIMITS;

export const RATE_LIMIT_TABLE = 'rate_limits';

/** Whether limits apply in this process (`DENUDATA_RATE_LIMITS=off` turns them off). */
export function rateLimitsEnabled(): boolean {
  return (process.env.DENUDATA_RATE_LIMITS ?? 'on').toLowerCase() !== 'off';
}

/** One limit on one store; two of these on the same table share their counts (two app instances). */
export class RateLimit {
  readonly name: RateLimitName;
  readonly points: number;
  readonly duration: number;
  private readonly limiter: RateLimiterPostgres;

  constructor(name: RateLimitName, sequelize: Sequelize) {
    const spec = RATE_LIMITS[name];
    this.name = name;
    this.points = spec.points;
    this.duration = spec.duration;
    this.limiter = new RateLimiterPostgres({
      storeClient: sequelize,
      storeType: 'sequelize',
      tableName: RATE_LIMIT_TABLE,
      tableCreated: true,
      clearExpiredByTimeout: false,
      keyPrefix: name,
      points: spec.points,
      duration: spec.duration,
    });
  }

  /** Counts one event; throws 429 when that goes past the limit. */
  async consume(key: string): Promise<void> {
    try {
      await this.limiter.consume(normaliseKey(key));
    } catch (error) {
      if (error instanceof RateLimiterRes) throw this.refusal(error.msBeforeNext);
      throw error;
    }
  }

  /** Counts one event without refusing (failures counted after the fact, such as a wrong password). */
  async penalise(key: string): Promise<void> {
    await this.limiter.penalty(normaliseKey(key), 1);
  }

  /** Throws 429 when the key has already used up its limit in the current window (nothing is counted). */
  async check(key: string): Promise<void> {
    const state = await this.limiter.get(normaliseKey(key));
    if (state && state.consumedPoints >= this.points) throw this.refusal(state.msBeforeNext);
  }

  /** 429 rate_limited with Retry-After and a message that says when to try again. */
  private refusal(msBeforeNext: number) {
    const seconds = Math.max(1, Math.ceil(msBeforeNext / 1000));
    return rateLimited(`${RATE_LIMITS[this.name].what}. Try again in ${describeWait(seconds)}.`, seconds);
  }

  /** Forgets the key's count (used by tests that end a window early). */
  async reset(key: string): Promise<void> {
    await this.limiter.delete(normaliseKey(key));
  }
}

/** Keys are bounded (the column is varchar(255)) and case-insensitive for e-mail addresses. */
function normaliseKey(key: string): string {
  return key.trim().toLowerCase().slice(0, 200);
}

const globalForLimits = globalThis as unknown as { denudataRateLimits?: Map<RateLimitName, RateLimit> };

function limitFor(name: RateLimitName): RateLimit {
  globalForLimits.denudataRateLimits ??= new Map();
  let limit = globalForLimits.denudataRateLimits.get(name);
  if (!limit) {
    limit = new RateLimit(name, getSequelize());
    globalForLimits.denudataRateLimits.set(name, limit);
  }
  return limit;
}

/** Counts one event against each named limit for its key; 429 as soon as one is past its limit. */
export async function consumeRateLimit(...entries: [RateLimitName, string | null | undefined][]): Promise<void> {
  if (!rateLimitsEnabled()) return;
  for (const [name, key] of entries) if (key) await limitFor(name).consume(key);
}

/** 429 when any of the keys has used up its limit already (nothing counted). */
export async function checkRateLimit(...entries: [RateLimitName, string | null | undefined][]): Promise<void> {
  if (!rateLimitsEnabled()) return;
  for (const [name, key] of entries) if (key) await limitFor(name).check(key);
}

/** Counts a failure against each limit, without refusing this request. */
export async function penaliseRateLimit(...entries: [RateLimitName, string | null | undefined][]): Promise<void> {
  if (!rateLimitsEnabled()) return;
  for (const [name, key] of entries) if (key) await limitFor(name).penalise(key);
}

/**
 * Deletes the counters whose window has ended (`expire` in the past): they count nothing any more, and
 * without this the table keeps one row per key ever seen (every client address, e-mail address and
 * user). A job of the queue runs it every 10 minutes (lib/jobs/workers.ts). Safe beside live limits: a
 * counter written again at the same moment has a new `expire` and no longer matches. Returns the rows
 * deleted.
 */
export async function pruneRateLimits(sequelize: Sequelize = getSequelize(), now = Date.now()): Promise<number> {
  const [, result] = await sequelize.query(`DELETE FROM ${RATE_LIMIT_TABLE} WHERE expire IS NOT NULL AND expire < $1`, { bind: [now] });
  return (result as { rowCount?: number } | undefined)?.rowCount ?? 0;
}

/**
 * The client's address for per-address limits. Behind a trusted proxy (the request's peer, which the server
 * writes into PEER_HEADER, is loopback or listed in DENUDATA_TRUSTED_PROXIES): the last entry of X-Forwarded-For,
 * the one that proxy wrote (nginx: `proxy_set_header X-Forwarded-For $remote_addr`). From any other peer: the
 * peer itself, so a client talking to the app directly cannot spread its attempts over made-up addresses.
 * Without a peer header (called outside the server): the last X-Forwarded-For entry, as before.
 */
export function clientAddress(headers: Headers | Record<string, string | string[] | undefined>): string {
  const read = (name: string) => {
    const raw = headers instanceof Headers ? headers.get(name) : headers[name];
    return (Array.isArray(raw) ? raw.join(',') : raw) ?? undefined;
  };
  const peer = read(PEER_HEADER)?.trim();
  if (peer && !isTrustedProxy(peer)) return normaliseAddress(peer).slice(0, 64);
  const last = read('x-forwarded-for')?.split(',').map((part) => part.trim()).filter(Boolean).pop();
  if (last) return last.slice(0, 64);
  return peer ? normaliseAddress(peer).slice(0, 64) : 'unknown';
}
