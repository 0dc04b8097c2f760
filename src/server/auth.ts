/**
 * Sign-in for Torquetrail: better-auth with e-mail and password, and shops as its
 * organizations with our four roles. Its tables are created by our committed migrations.
 */
import { betterAuth } from 'better-auth';
import { organization } from 'better-auth/plugins';
import { ac, roles } from '../lib/access';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from '../domain/account';
import { config, trustedOrigins } from './config';
import { sendMail } from './mailer';
import { pgPool } from './pg-pool';

function createAuth() {
  const c = config();
  return betterAuth({
    appName: 'Torquetrail',
    baseURL: c.PUBLIC_URL,
    secret: c.BETTER_AUTH_SECRET,
    database: pgPool(),
    trustedOrigins: trustedOrigins(c),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: MIN_PASSWORD_LENGTH,
      maxPasswordLength: MAX_PASSWORD_LENGTH,
      resetPasswordTokenExpiresIn: 60 * 60,
      sendResetPassword: async ({ user, url }) => {
        await sendMail({
          to: user.email,
          subject: 'Reset your Torquetrail password',
          text: `Someone asked to reset the password of ${user.email} on Torquetrail.\n\nSet a new password here (the link works for one hour):\n${url}\n\nIf it was not you, ignore this message.`,
        });
      },
    },
    session: { expiresIn: 60 * 60 * 24 * 14, updateAge: 60 * 60 * 24 },
    rateLimit: { enabled: c.NODE_ENV === 'production', window: 60, max: 300, customRules: { '/sign-in/email': { window: 60, max: c.SIGNIN_RATE_LIMIT } } },
    advanced: {
      useSecureCookies: c.PUBLIC_URL.startsWith('https://'),
      // Behind a load balancer the client address arrives in these headers (see README).
      ipAddress: { ipAddressHeaders: ['x-forwarded-for', 'x-real-ip'] },
    },
    plugins: [
      organization({
        ac,
        roles,
        creatorRole: 'owner',
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 60 * 60 * 24 * 7,
        sendInvitationEmail: async ({ id, email, role, organization: shop, inviter }) => {
          const url = `${c.PUBLIC_URL}/invitation/${encodeURIComponent(id)}`;
          await sendMail({
            to: email,
            subject: `Join ${shop.name} on Torquetrail`,
            text: `${inviter.user.name} invited you to join ${shop.name} on Torquetrail as ${role}.\n\nAccept the invitation here (valid for 7 days):\n${url}\n`,
          });
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
let instance: Auth | undefined;

/** The better-auth instance, created on first use so configuration errors surface at start. */
export function auth(): Auth {
  instance ??= createAuth();
  return instance;
}
