import { asc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { account, customers, user } from '../../db/schema';
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

const summaryColumns = {
  id: user.id,
  name: user.name,
  email: user.email,
  role: user.role,
  customerId: user.customerId,
  customerName: customers.organisation,
  createdAt: user.createdAt,
};

type SummaryRow = { id: string; name: string; email: string; role: string | null; customerId: string | null; customerName: string | null; createdAt: Date };

const toSummary = (r: SummaryRow): UserSummary => ({
  ...r,
  role: roleSchema.safeParse(r.role).data ?? null,
  createdAt: r.createdAt.toISOString(),
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
  };
}
export type UsersRepository = ReturnType<typeof createUsersRepository>;
