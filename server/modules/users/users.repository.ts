import { and, asc, eq, gt, isNull, like, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { account, customers, session, user, verification } from '../../db/schema';
import { roleSchema, type Role } from '../../../shared/schemas/roles';
import type { UserSummary } from '../../../shared/schemas/users.schema';

export type NewUserRow = {
  name: string;
  email: string;
  role: Role;
  customerId: string | null;
  passwordHash: string;
  now: Date;
};

/** Invitation and reset tokens live in better-auth's verification table under this prefix. */
const INVITE_PREFIX = 'emberline-invite:';

const summaryColumns = {
  id: user.id,
  name: user.name,
  email: user.email,
  role: user.role,
  customerId: user.customerId,
  customerName: customers.organisation,
  createdAt: user.createdAt,
  deactivatedAt: user.deactivatedAt,
  invitationPending: sql<boolean>`exists (select 1 from ${verification} where ${verification.identifier} = ${INVITE_PREFIX} || ${user.id}::text and ${verification.expiresAt} > now())`,
};

type SummaryRow = {
  id: string;
  name: string;
  email: string;
  role: string | null;
  customerId: string | null;
  customerName: string | null;
  createdAt: Date;
  deactivatedAt: Date | null;
  invitationPending: boolean;
};

const toSummary = (r: SummaryRow): UserSummary => ({
  ...r,
  role: roleSchema.safeParse(r.role).data ?? null,
  createdAt: r.createdAt.toISOString(),
  active: r.deactivatedAt === null,
  deactivatedAt: r.deactivatedAt?.toISOString() ?? null,
  invitationPending: Boolean(r.invitationPending),
});

export function createUsersRepository(db: Db) {
  return {
    async list(): Promise<UserSummary[]> {
      const rows = await db
        .select(summaryColumns)
        .from(user)
        .leftJoin(customers, eq(customers.id, user.customerId))
        .orderBy(asc(user.email));
      return rows.map(toSummary);
    },
    async findSummary(id: string, tx: Db = db): Promise<UserSummary | null> {
      const [row] = await tx.select(summaryColumns).from(user).leftJoin(customers, eq(customers.id, user.customerId)).where(eq(user.id, id));
      return row ? toSummary(row) : null;
    },
    async findIdByEmail(email: string, tx: Db = db): Promise<string | null> {
      const [row] = await tx.select({ id: user.id }).from(user).where(eq(user.email, email.toLowerCase()));
      return row?.id ?? null;
    },
    /**
     * Inserts the user and its better-auth credential account in one transaction
     * (providerId 'credential', accountId = user id, as better-auth's own sign-up writes them).
     */
    async createWithPassword(row: NewUserRow, tx: Db = db): Promise<string> {
      return tx.transaction(async (t) => {
        const [created] = await t
          .insert(user)
          .values({
            name: row.name,
            email: row.email.toLowerCase(),
            emailVerified: true,
            role: row.role,
            customerId: row.customerId,
            createdAt: row.now,
            updatedAt: row.now,
          })
          .returning({ id: user.id });
        await t.insert(account).values({
          userId: created.id,
          accountId: created.id,
          providerId: 'credential',
          password: row.passwordHash,
          createdAt: row.now,
          updatedAt: row.now,
        });
        return created.id;
      });
    },
    async update(id: string, fields: { name: string; role: Role; customerId: string | null }, now: Date, tx: Db = db): Promise<void> {
      await tx.update(user).set({ ...fields, updatedAt: now }).where(eq(user.id, id));
    },
    async setDeactivated(id: string, at: Date | null, now: Date, tx: Db = db): Promise<void> {
      await tx.update(user).set({ deactivatedAt: at, updatedAt: now }).where(eq(user.id, id));
    },
    /**
     * Ids of active admins, rows locked until the end of the transaction: two admins demoting
     * each other at once cannot both pass the "last active admin" check.
     */
    async lockActiveAdminIds(tx: Db): Promise<string[]> {
      const rows = await tx
        .select({ id: user.id })
        .from(user)
        .where(and(eq(user.role, 'admin'), isNull(user.deactivatedAt)))
        .for('update');
      return rows.map((r) => r.id);
    },
    async revokeSessions(userId: string, tx: Db = db): Promise<void> {
      await tx.delete(session).where(eq(session.userId, userId));
    },
    async setPassword(userId: string, passwordHash: string, now: Date, tx: Db = db): Promise<void> {
      const updated = await tx
        .update(account)
        .set({ password: passwordHash, updatedAt: now })
        .where(and(eq(account.userId, userId), eq(account.providerId, 'credential')))
        .returning({ id: account.id });
      if (updated.length === 0) {
        await tx.insert(account).values({ userId, accountId: userId, providerId: 'credential', password: passwordHash, createdAt: now, updatedAt: now });
      }
    },
    /** Replaces any outstanding invitation of the user with a new one (only the token's hash is kept). */
    async putInvitation(userId: string, tokenHash: string, expiresAt: Date, now: Date, tx: Db = db): Promise<void> {
      await tx.delete(verification).where(eq(verification.identifier, INVITE_PREFIX + userId));
      await tx.insert(verification).values({ identifier: INVITE_PREFIX + userId, value: tokenHash, expiresAt, createdAt: now, updatedAt: now });
    },
    async findInvitation(tokenHash: string, now: Date, tx: Db = db): Promise<{ id: string; userId: string; expiresAt: Date } | null> {
      const [row] = await tx
        .select({ id: verification.id, identifier: verification.identifier, expiresAt: verification.expiresAt })
        .from(verification)
        .where(and(like(verification.identifier, `${INVITE_PREFIX}%`), eq(verification.value, tokenHash), gt(verification.expiresAt, now)));
      return row ? { id: row.id, userId: row.identifier.slice(INVITE_PREFIX.length), expiresAt: row.expiresAt } : null;
    },
    /** Deletes the invitation; false when it was gone already (used by someone else meanwhile). */
    async consumeInvitation(id: string, tx: Db = db): Promise<boolean> {
      const gone = await tx.delete(verification).where(eq(verification.id, id)).returning({ id: verification.id });
      return gone.length === 1;
    },
    async dropInvitations(userId: string, tx: Db = db): Promise<void> {
      await tx.delete(verification).where(eq(verification.identifier, INVITE_PREFIX + userId));
    },
  };
}
export type UsersRepository = ReturnType<typeof createUsersRepository>;
