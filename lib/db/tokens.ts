import 'server-only';
import { createHash, randomBytes } from 'node:crypto';

/** A fresh single-use token: 32 random bytes as base64url, and the SHA-256 that is all we store. */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
