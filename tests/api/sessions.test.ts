import { describe, expect, it } from 'vitest';
import { ApiClient, appUrl, newAccount } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';

// Common practice (OWASP Session Management Cheat Sheet): changing a password ends the account's other sessions.
describe('sessions after a password reset', () => {
  it('should refuse a session that signed in before the password was reset, and accept a new sign-in', async () => {
    const { client: before, email } = await newAccount('resetter');
    expect((await before.get('/api/teams')).status).toBe(200);

    expect((await new ApiClient().post('/api/password-reset', { email })).status).toBe(202);
    const mail = await waitForMail(email, /password/i);
    const token = linkIn(mail, `${appUrl()}/reset-password/`).split('/').pop()!;
    expect((await new ApiClient().post(`/api/password-reset/${token}`, { password: 'a-brand-new-password' })).status).toBe(200);

    const stale = await before.get('/api/teams');
    expect(stale.status).toBe(401);
    expect(stale.body.error.code).toBe('unauthenticated');

    const after = new ApiClient();
    expect(await after.signIn(email, 'a-brand-new-password')).toBe(true);
    expect((await after.get('/api/teams')).status).toBe(200);
    expect(await new ApiClient().signIn(email, 'long-enough-password')).toBe(false);
  });
});
