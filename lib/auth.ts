import 'server-only';
import { betterAuth } from 'better-auth';
import { APIError, createAuthMiddleware } from 'better-auth/api';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { nextCookies } from 'better-auth/next-js';
import { organization } from 'better-auth/plugins';
import { db } from '@/db/client';
import * as schema from '@/db/schema';
import { env } from '@/lib/env';
import { ac, roles } from '@/lib/permissions';
import { enqueueMail } from '@/db/queries/mail';
import { CLIENT_ADDRESS_HEADER, LIMITED_AUTH_PATHS } from '@/lib/auth-guard';
import { authRules, betterAuthRateStorage } from '@/lib/services/rate-limit';
import { COMMON_PASSWORD_MESSAGE, isCommonPassword } from '@/lib/password-policy';
import { existingAccountMail, invitationMail, resetPasswordMail, verifyEmailMail } from '@/lib/mail/templates';

/** The endpoints that set a password, and the body field that carries it. */
const NEW_PASSWORD_FIELD: Record<string, string> = {
  '/sign-up/email': 'password',
  '/reset-password': 'newPassword',
  '/change-password': 'newPassword',
  '/set-password': 'newPassword',
};

function createAuth() {
  const e = env();
  return betterAuth({
    appName: 'Lattice Ledger',
    secret: e.BETTER_AUTH_SECRET,
    baseURL: e.BETTER_AUTH_URL,
    database: drizzleAdapter(db, { provider: 'sqlite', schema }),
    emailAndPassword: {
      enabled: true,
      requireEmailVerification: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      revokeSessionsOnPasswordReset: true,
      resetPasswordTokenExpiresIn: 60 * 60,
      // A sign-up with a used address answers like a new one (no account enumeration);
      // the owner of the address is told by e-mail instead.
      onExistingUserSignUp: async ({ user }) => {
        await enqueueMail(existingAccountMail({ to: user.email, name: user.name, signInUrl: `${e.BETTER_AUTH_URL}/sign-in`, resetUrl: `${e.BETTER_AUTH_URL}/forgot-password` }));
      },
      sendResetPassword: async ({ user, url }) => {
        await enqueueMail(resetPasswordMail({ to: user.email, name: user.name, url }));
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      autoSignInAfterVerification: true,
      expiresIn: 60 * 60 * 24,
      sendVerificationEmail: async ({ user, url }) => {
        await enqueueMail(verifyEmailMail({ to: user.email, name: user.name, url }));
      },
    },
    // Every way a password is chosen refuses the most common ones (lib/password-policy.ts).
    hooks: {
      before: createAuthMiddleware(async (ctx) => {
        const field = NEW_PASSWORD_FIELD[ctx.path];
        const password = field ? (ctx.body as Record<string, unknown> | undefined)?.[field] : undefined;
        if (typeof password === 'string' && isCommonPassword(password)) {
          throw new APIError('BAD_REQUEST', { code: 'PASSWORD_TOO_COMMON', message: COMMON_PASSWORD_MESSAGE });
        }
      }),
    },
    advanced: {
      // Served over https (BETTER_AUTH_URL is the public origin): cookies are Secure and __Secure- prefixed.
      // Over plain http (local runs) they cannot be, or the browser would never send them back.
      useSecureCookies: new URL(e.BETTER_AUTH_URL).protocol === 'https:',
      // The client address is the one lib/auth-guard.ts wrote from the socket; a client's X-Forwarded-For never
      // reaches better-auth. Sign-in, sign-up and reset are limited there (per client and per account); the other
      // endpoints keep better-auth's limits, stored in the same bounded table.
      ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    },
    rateLimit: {
      enabled: true,
      window: authRules().general.windowSeconds,
      max: authRules().general.max,
      customStorage: betterAuthRateStorage,
      customRules: Object.fromEntries(Object.keys(LIMITED_AUTH_PATHS).map((path) => [path, false as const])),
    },
    plugins: [
      organization({
        ac,
        roles,
        creatorRole: 'owner',
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 60 * 60 * 24 * 7,
        cancelPendingInvitationsOnReInvite: true,
        requireEmailVerificationOnInvitation: true,
        sendInvitationEmail: async ({ id, email, role, organization: workspace, inviter }) => {
          await enqueueMail(
            invitationMail({
              to: email,
              workspaceName: workspace.name,
              inviterName: inviter.user.name,
              role,
              url: `${e.BETTER_AUTH_URL}/invitations/${id}`,
            }),
            workspace.id,
          );
        },
      }),
      nextCookies(),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;

const globalForAuth = globalThis as unknown as { ledgerAuth?: Auth };

/** The better-auth instance, built on first use (the environment is read then, not at import). */
export function getAuth(): Auth {
  globalForAuth.ledgerAuth ??= createAuth();
  return globalForAuth.ledgerAuth;
}
