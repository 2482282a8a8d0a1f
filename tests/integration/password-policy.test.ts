import { describe, expect, it } from 'vitest';
import { commonPasswordCount } from '@/lib/password-policy';
import { authRequest } from '../support/auth-http';

let n = 0;
const ip = () => `192.0.2.${++n}`;

describe('the most common passwords are refused', () => {
  it('uses a list shipped in an npm package (no download at run time)', () => {
    expect(commonPasswordCount()).toBeGreaterThan(40_000);
  });

  it.each(['password123', '1234567890', 'qwertyuiop', 'Password1234', 'ILOVEYOU12'])('sign-up refuses %s', async (password) => {
    const res = await authRequest('/sign-up/email', { body: { name: 'P', email: `pw-${n}@example.org`, password }, ip: ip() });
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ code: 'PASSWORD_TOO_COMMON', message: expect.stringMatching(/most common/) });
  });

  it('sign-up accepts an uncommon password of the same length', async () => {
    const res = await authRequest('/sign-up/email', { body: { name: 'P', email: 'pw-ok@example.org', password: 'lattice-ZnO-e2high' }, ip: ip() });
    expect(res.status).toBe(200);
  });

  it('a password reset refuses a common password before it looks at the token', async () => {
    const common = await authRequest('/reset-password', { body: { newPassword: '1q2w3e4r5t', token: 'not-a-token' }, ip: ip() });
    expect(common.status).toBe(400);
    expect(await common.json()).toMatchObject({ code: 'PASSWORD_TOO_COMMON' });
    const rare = await authRequest('/reset-password', { body: { newPassword: 'lattice-ZnO-e2high', token: 'not-a-token' }, ip: ip() });
    expect(((await rare.json()) as { code?: string }).code).not.toBe('PASSWORD_TOO_COMMON');
  });
});
