import { describe, expect, it } from 'vitest';
import { completeResetSchema } from '@/app/api/password-reset/schema';
import { signUpSchema } from '@/app/api/users/schema';

// bcrypt uses only the first 72 bytes of its input (the bcrypt algorithm's key schedule; Provos & Mazières 1999),
// so a longer password would be cut silently: both forms refuse it instead.
describe('password rules for sign-up and reset', () => {
  const base = { email: 'someone@example.org', name: 'Someone' };

  it('should accept a password of 10 to 72 plain characters', () => {
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(10) }).success).toBe(true);
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(72) }).success).toBe(true);
  });

  it('should refuse a password shorter than 10 characters with a message', () => {
    const parsed = signUpSchema.safeParse({ ...base, password: 'a'.repeat(9) });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]?.message).toBe('use at least 10 characters');
  });

  it('should refuse a password longer than 72 bytes, counting multi-byte letters by their bytes', () => {
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(73) }).success).toBe(false);
    // 'é' is 2 bytes in UTF-8: 37 of them make 74 bytes from 37 characters.
    const accented = completeResetSchema.safeParse({ password: 'é'.repeat(37) });
    expect(accented.success).toBe(false);
    expect(accented.error?.issues[0]?.message).toMatch(/at most 72 bytes/);
    expect(completeResetSchema.safeParse({ password: 'é'.repeat(36) }).success).toBe(true);
  });
});
