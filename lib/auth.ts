import 'server-only';
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { nextCookies } from 'better-auth/next-js';
import { organization } from 'better-auth/plugins';
import { db } from '@/db/client';
import * as schema from '@/db/schema';
import { env } from '@/lib/env';
import { ac, roles } from '@/lib/permissions';
import { enqueueMail } from '@/db/queries/mail';
import { existingAccountMail, invitationMail, resetPasswordMail, verifyEmailMail } from '@/lib/mail/templates';

function createAuth() {
  const e = env();
  const rule = { window: e.AUTH_RATE_LIMIT_WINDOW_SECONDS, max: e.AUTH_RATE_LIMIT_MAX };
  return betterAuth({
    appName: 'Lattice Ledger',
    secret: e.BETTER_AUTH_SECRET,
    baseURL: e.BETTER_AUTH_URL,
    // Served over https (BETTER_AUTH_URL is the public origin): cookies are Secure and __Secure- prefixed.
    // Over plain http (local runs) they cannot be, or the browser would never send them back.
    advanced: { useSecureCookies: new URL(e.BETTER_AUTH_URL).protocol === 'https:' },
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
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: e.AUTH_RATE_LIMIT_WINDOW_SECONDS,
      max: e.AUTH_RATE_LIMIT_MAX * 10,
      customRules: {
        '/sign-in/email': rule,
        '/sign-up/email': rule,
        '/request-password-reset': rule,
        '/reset-password': rule,
      },
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
