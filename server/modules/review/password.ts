/**
 * Re-authentication for the electronic signature of an approval. The password is checked against
 * the credential hash in better-auth's `account` table with better-auth's own verifier
 * (`(await auth.$context).password.verify`), the same function its sign-in uses. This was chosen
 * over calling `auth.api.signInEmail`, which would create (and then need to revoke) a second
 * session and run the session hooks; verifying the hash creates nothing and sets no cookie.
 */
import { and, eq } from 'drizzle-orm';
import type { Auth } from '../../auth/auth';
import type { Db } from '../../db/client';
import { account } from '../../db/schema';

export async function verifyUserPassword(auth: Auth, db: Db, userId: string, password: string): Promise<boolean> {
  const [row] = await db
    .select({ hash: account.password })
    .from(account)
    .where(and(eq(account.userId, userId), eq(account.providerId, 'credential')));
  if (!row?.hash) return false;
  const ctx = await auth.$context;
  try {
    return await ctx.password.verify({ hash: row.hash, password });
  } catch {
    return false;
  }
}
