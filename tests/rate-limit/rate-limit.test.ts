// The limits of CONTRACT §3 on their shared PostgreSQL store (lib/rate-limit): every limit counts to its
// number in its window and refuses the next event with 429 rate_limited and Retry-After; two limiter
// objects on the same table (as two app instances hold) share the count. Real PostgreSQL.
import { afterAll, describe, expect, it, vi } from 'vitest';
import { AppError } from '@/lib/errors';
import { RATE_LIMITS, RateLimit, clientAddress, type RateLimitName } from '@/lib/rate-limit';
import { PEER_HEADER, isTrustedProxy } from '@/lib/http/peer';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { Sequelize } from 'sequelize';
import pg from 'pg';
import { databaseUrl } from '@/lib/db/config';

// A second connection pool stands for a second app instance on the same database.
const other = new Sequelize(databaseUrl(), { dialect: 'postgres', dialectModule: pg, logging: false, pool: { max: 2 } });

afterAll(async () => {
  await other.close();
  await closeSequelize();
});

const unique = (label: string) => `${label}-${Date.now()}-${Math.random().toString(36).slice(2)}`;

async function refusal(promise: Promise<unknown>): Promise<AppError | null> {
  try {
    await promise;
    return null;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
}

// CONTRACT §3, as numbers: [limit, events, window in seconds].
const CONTRACT: [RateLimitName, number, number][] = [
  ['signInAccount', 10, 15 * 60],
  ['signInAddress', 50, 15 * 60],
  ['signUpAddress', 10, 60 * 60],
  ['resetEmail', 5, 60 * 60],
  ['resetAddress', 20, 60 * 60],
  ['invitationTeam', 50, 24 * 60 * 60],
  ['evaluationUser', 120, 60],
];

describe('the limits of CONTRACT §3', () => {
  it('should hold the contract numbers', () => {
    for (const [name, points, duration] of CONTRACT) {
      expect({ name, points: RATE_LIMITS[name].points, duration: RATE_LIMITS[name].duration }).toEqual({ name, points, duration });
    }
  });

  for (const [name, points, duration] of CONTRACT) {
    it(`${name}: should allow ${points} events per key, refuse the next with 429 and Retry-After ≤ ${duration} s, and keep other keys apart`, async () => {
      const a = new RateLimit(name, getSequelize());
      const b = new RateLimit(name, other);
      const key = unique(name);
      // Spread over both "instances": the count is shared.
      for (let i = 0; i < points; i++) await (i % 2 === 0 ? a : b).consume(key);
      const refused = await refusal(b.consume(key));
      expect(refused?.status).toBe(429);
      expect(refused?.code).toBe('rate_limited');
      const retryAfter = Number(refused?.retryAfter);
      expect(retryAfter).toBeGreaterThan(duration - 60);
      expect(retryAfter).toBeLessThanOrEqual(duration);
      expect(refused?.message).toMatch(/Try again in \d+ (second|minute|hour)s?\./);
      expect(await refusal(a.consume(unique(name)))).toBeNull();
    });
  }
});

describe('sign-in failures (check, then count a failure)', () => {
  it('should refuse the 11th attempt for an account after 10 failures, counted on two instances, until the window passes', async () => {
    const a = new RateLimit('signInAccount', getSequelize());
    const b = new RateLimit('signInAccount', other);
    const account = unique('person@example.test');
    for (let i = 0; i < 10; i++) {
      expect(await refusal((i < 5 ? a : b).check(account))).toBeNull();
      await (i < 5 ? a : b).penalise(account);
    }
    expect((await refusal(a.check(account)))?.status).toBe(429);
    expect((await refusal(b.check(account)))?.status).toBe(429);
    // The window passes: its end moves into the past in the shared table.
    await getSequelize().query('UPDATE rate_limits SET expire = $1 WHERE key = $2', { bind: [Date.now() - 1, `signInAccount:${account.toLowerCase()}`] });
    expect(await refusal(b.check(account))).toBeNull();
  });

  it('should treat e-mail addresses without regard to case', async () => {
    const limit = new RateLimit('resetEmail', getSequelize());
    const email = unique('Case@Example.Test');
    for (let i = 0; i < 5; i++) await limit.consume(i % 2 ? email.toUpperCase() : email.toLowerCase());
    expect((await refusal(limit.consume(email)))?.status).toBe(429);
  });
});

describe('clientAddress', () => {
  it('should take the last X-Forwarded-For entry (the one the nearest proxy, or Next.js itself, wrote)', () => {
    expect(clientAddress(new Headers({ 'x-forwarded-for': '203.0.113.9, 10.0.0.2' }))).toBe('10.0.0.2');
    expect(clientAddress({ 'x-forwarded-for': '::1' })).toBe('::1');
    expect(clientAddress(new Headers())).toBe('unknown');
  });

  it('should believe X-Forwarded-For only from a trusted peer (loopback or DENUDATA_TRUSTED_PROXIES), else take the peer', () => {
    const forwarded = '198.51.100.7, 203.0.113.40';
    // Behind a proxy on the same host (and in the test runs): the entry that proxy wrote.
    expect(clientAddress(new Headers({ [PEER_HEADER]: '127.0.0.1', 'x-forwarded-for': forwarded }))).toBe('203.0.113.40');
    expect(clientAddress({ [PEER_HEADER]: '::ffff:127.0.0.1', 'x-forwarded-for': forwarded })).toBe('203.0.113.40');
    expect(clientAddress({ [PEER_HEADER]: '::1', 'x-forwarded-for': forwarded })).toBe('203.0.113.40');
    // A client talking to the app directly: its own address, whatever it claims.
    expect(clientAddress({ [PEER_HEADER]: '192.0.2.33', 'x-forwarded-for': forwarded })).toBe('192.0.2.33');
    expect(clientAddress({ [PEER_HEADER]: '::ffff:192.0.2.33', 'x-forwarded-for': forwarded })).toBe('192.0.2.33');
    expect(clientAddress({ [PEER_HEADER]: '2001:DB8::5' })).toBe('2001:db8::5');
    // A trusted peer that forwarded nothing: the peer.
    expect(clientAddress({ [PEER_HEADER]: '127.0.0.1' })).toBe('127.0.0.1');
  });

  it('should trust the proxies listed in DENUDATA_TRUSTED_PROXIES and no look-alikes', () => {
    expect(isTrustedProxy('10.0.0.2', '10.0.0.2, 10.0.0.3')).toBe(true);
    expect(isTrustedProxy('::ffff:10.0.0.3', '10.0.0.2,10.0.0.3')).toBe(true);
    expect(isTrustedProxy('10.0.0.20', '10.0.0.2')).toBe(false);
    expect(isTrustedProxy('127.0.0.1', '')).toBe(true);
    expect(isTrustedProxy('127.1.2.3', '')).toBe(true);
    expect(isTrustedProxy('128.0.0.1', '')).toBe(false);
    expect(isTrustedProxy('::2', '')).toBe(false);
    expect(isTrustedProxy('192.0.2.33', '')).toBe(false);
    vi.stubEnv('DENUDATA_TRUSTED_PROXIES', '192.0.2.33');
    try {
      expect(clientAddress({ [PEER_HEADER]: '192.0.2.33', 'x-forwarded-for': '198.51.100.7' })).toBe('198.51.100.7');
    } finally {
      vi.unstubAllEnvs();
    }
  });
});
