/** The password rule as the forms state it; the server enforces it (lib/auth.ts, lib/password-policy.ts). */
export const PASSWORD_RULE = 'At least 10 characters, and not one of the most common passwords.';
