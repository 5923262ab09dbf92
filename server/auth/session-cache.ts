import type { RequestHandler } from 'express';
import type { SessionUser } from '../../shared/schemas/me.schema';

/**
 * A short-lived, per-instance memory of session look-ups, keyed by the request's Cookie header.
 *
 * Why: every API request asks better-auth for its session, two database queries that cost more
 * than the work of a small request such as a GUM recompute (on the embedded database they run on
 * the server's one JavaScript thread). With the cache a browser's burst of requests costs one look-up.
 *
 * What keeps it honest:
 * - an entry lives `ttlMs` at most, and never past the session's own expiry;
 * - `clear()` forgets everything at once; it is called after every request that can end or
 *   change a session or a user (any non-GET under /api/auth, /api/users and /api/invitations:
 *   sign-out, password change, role change, deactivation, a password set from a link), so on one instance a revoked session is refused by the
 *   next request, as without the cache;
 * - a look-up that began before a clear() is not stored (generation count), so a request that
 *   raced the change cannot put the old session back.
 * On another instance (several app instances behind a load balancer) a revoked session can still
 * be accepted for at most `ttlMs`: SESSION_CACHE_SECONDS sets it, 0 turns the cache off.
 */
export interface SessionCache {
  readonly ttlMs: number;
  /** The cached user for `key`, or undefined (also when expired). */
  get(key: string, now: number): SessionUser | undefined;
  /** The generation to pass to `set` for a look-up starting now. */
  generation(): number;
  /** Remember a looked-up session, unless clear() ran since `generation` was taken. */
  set(key: string, user: SessionUser, sessionExpiresAt: number, now: number, generation: number): void;
  clear(): void;
}

/** Entries kept at most; the least recently used go first. */
const MAX_ENTRIES = 2000;

export function createSessionCache(ttlMs: number): SessionCache {
  const entries = new Map<string, { user: SessionUser; until: number }>();
  let gen = 0;
  return {
    ttlMs,
    get(key, now) {
      const e = entries.get(key);
      if (!e) return undefined;
      entries.delete(key);
      if (now >= e.until) return undefined;
      entries.set(key, e); // most recently used last
      return e.user;
    },
    generation: () => gen,
    set(key, user, sessionExpiresAt, now, generation) {
      if (ttlMs <= 0 || generation !== gen) return;
      const until = Math.min(now + ttlMs, sessionExpiresAt);
      if (!(until > now)) return;
      entries.delete(key);
      entries.set(key, { user, until });
      if (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value as string);
    },
    clear() {
      gen++;
      entries.clear();
    },
  };
}

/**
 * Clears the session cache once a request that may change sessions or users has been answered
 * (any method but GET, HEAD and OPTIONS). Mounted on /api/auth, /api/users and /api/invitations.
 */
export function clearSessionCacheAfterWrites(cache: SessionCache): RequestHandler {
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD' && req.method !== 'OPTIONS') {
      cache.clear();
      res.on('finish', () => cache.clear());
    }
    next();
  };
}
