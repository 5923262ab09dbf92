import type { RequestHandler } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { roleSchema, type Role } from '../../shared/schemas/roles';
import type { SessionUser } from '../../shared/schemas/me.schema';
import { ForbiddenError, UnauthorizedError } from '../errors/app-error';
import type { Auth } from './auth';
import type { SessionCache } from './session-cache';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The signed-in user, set by `loadSession`; null when there is no valid session. */
      user?: SessionUser | null;
      /** The parsed query, set by `validate({ query })`. */
      query?: unknown;
    }
  }
}

/**
 * Reads the better-auth session cookie once per API request and puts the user in
 * `res.locals.user` (null without a valid session). Mounted in createApp before the modules.
 * With a session cache (SESSION_CACHE_SECONDS), a session looked up shortly before is taken from
 * it instead of the database; see server/auth/session-cache.ts for when it is forgotten.
 */
export function loadSession(auth: Auth, cache?: SessionCache, clock: () => Date = () => new Date()): RequestHandler {
  return async (req, res, next) => {
    const key = cache && cache.ttlMs > 0 ? req.headers.cookie : undefined;
    if (key) {
      const hit = cache!.get(key, clock().getTime());
      if (hit) {
        res.locals.user = hit;
        return next();
      }
    }
    const generation = cache?.generation() ?? 0;
    const found = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
    if (!found) {
      res.locals.user = null;
      return next();
    }
    const u = found.user as typeof found.user & { role?: string | null; customerId?: string | null };
    const role = roleSchema.safeParse(u.role);
    const user: SessionUser = {
      id: u.id,
      name: u.name,
      email: u.email,
      role: role.success ? role.data : null,
      customerId: u.customerId ?? null,
    };
    if (key) cache!.set(key, user, new Date(found.session.expiresAt).getTime(), clock().getTime(), generation);
    res.locals.user = user;
    next();
  };
}

/**
 * Guards a route. Without a session: 401. With roles given and the user's role not among them:
 * 403. `requireRole()` with no roles admits any signed-in user, also one without a role yet
 * (used by /api/me only). Every non-public route uses this and nothing else.
 */
export function requireRole(...roles: Role[]): RequestHandler {
  return (_req, res, next) => {
    const user = res.locals.user;
    if (!user) return next(new UnauthorizedError());
    if (roles.length > 0 && (!user.role || !roles.includes(user.role))) {
      return next(new ForbiddenError(user.role ? 'Your role does not allow this.' : 'Your account has no role yet: ask an administrator to give you one.'));
    }
    next();
  };
}

/** The signed-in user inside a guarded route (requireRole has run). */
export function currentUser(res: { locals: { user?: SessionUser | null } }): SessionUser {
  const user = res.locals.user;
  if (!user) throw new UnauthorizedError();
  return user;
}
