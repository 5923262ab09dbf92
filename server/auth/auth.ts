import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { APIError } from 'better-auth/api';
import { eq } from 'drizzle-orm';
import type { Config } from '../config/env';
import type { Db } from '../db/client';
import { account, session, user, verification } from '../db/schema';
import { CLIENT_ADDRESS_HEADER } from '../security/client-address';
import { PASSWORD_MIN_LENGTH } from '../../shared/schemas/users.schema';

/** Origins allowed to call /api/auth besides BASE_URL: the Vite dev server in development. */
export function trustedOrigins(config: Pick<Config, 'baseUrl' | 'nodeEnv'>): string[] {
  const origins = [new URL(config.baseUrl).origin];
  if (config.nodeEnv === 'development') origins.push('http://localhost:5173', 'http://127.0.0.1:5173');
  return origins;
}

/**
 * better-auth: e-mail and password only. `role` and `customerId` are additional user fields with
 * `input: false`, so no sign-up or update body can set them; only server code (users service,
 * seed) writes them. Public sign-up is refused unless SIGNUP_ENABLED; a self-registered account
 * has role null and no access until an admin gives it one.
 */
export function createAuth(opts: { config: Config; db: Db; secret: string }) {
  const { config } = opts;
  const secure = config.baseUrl.startsWith('https://');
  return betterAuth({
    appName: 'Emberline',
    baseURL: config.baseUrl,
    basePath: '/api/auth',
    secret: opts.secret,
    trustedOrigins: trustedOrigins(config),
    database: drizzleAdapter(opts.db, { provider: 'pg', schema: { user, session, account, verification } }),
    emailAndPassword: {
      enabled: true,
      disableSignUp: !config.signupEnabled,
      minPasswordLength: PASSWORD_MIN_LENGTH,
      maxPasswordLength: 128,
    },
    user: {
      additionalFields: {
        role: { type: 'string', required: false, input: false },
        customerId: { type: 'string', required: false, input: false },
      },
    },
    databaseHooks: {
      session: {
        create: {
          // A deactivated account gets no session, whatever the password (issue 7).
          before: async (s) => {
            const [row] = await opts.db.select({ deactivatedAt: user.deactivatedAt }).from(user).where(eq(user.id, s.userId));
            if (row?.deactivatedAt) throw new APIError('FORBIDDEN', { message: 'This account has been deactivated. Ask an administrator to reactivate it.', code: 'ACCOUNT_DEACTIVATED' });
          },
        },
      },
    },
    session: {
      expiresIn: 60 * 60 * 24 * 7,
      updateAge: 60 * 60 * 24,
    },
    rateLimit: {
      enabled: config.nodeEnv === 'production',
      window: 60,
      max: 100,
      customRules: { '/sign-in/email': { window: 60, max: 30 }, '/sign-up/email': { window: 60, max: 10 } },
    },
    advanced: {
      useSecureCookies: secure,
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax', secure },
      database: { generateId: 'uuid' },
      // The client's address comes from Express (server/security/client-address.ts), never from
      // a header the client wrote.
      ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
      // better-auth turns the origin check off by itself under NODE_ENV=test; keep it on, so the
      // tests exercise what production does.
      disableOriginCheck: false,
    },
    telemetry: { enabled: false },
  });
}

export type Auth = ReturnType<typeof createAuth>;
