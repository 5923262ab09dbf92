import crypto from 'node:crypto';
import type { Auth } from '../../auth/auth';
import { recordAudit, type AuditActor } from '../../audit';
import type { Db } from '../../db/client';
import { ConflictError, ValidationError } from '../../errors/app-error';
import type { CreateUserInput, UserSummary } from '../../../shared/schemas/users.schema';
import type { CustomersRepository } from '../customers/customers.repository';
import type { UsersRepository } from './users.repository';

/** Hashes a password with better-auth's own hasher, so better-auth can verify it at sign-in. */
export async function hashPassword(auth: Auth, password: string): Promise<string> {
  const ctx = await auth.$context;
  return ctx.password.hash(password);
}

export function createUsersService(deps: {
  db: Db;
  usersRepo: UsersRepository;
  customersRepo: CustomersRepository;
  auth: Auth;
  clock: () => Date;
}) {
  const service = {
    list(): Promise<UserSummary[]> {
      return deps.usersRepo.list();
    },

    /**
     * Creates a user with a role, server-side (public sign-up stays off). Without a password the
     * account gets a long random one nobody knows; issue 7 adds the invitation e-mail that lets
     * the person choose theirs.
     */
    async create(input: CreateUserInput, tx?: Db, actor: AuditActor | null = null): Promise<UserSummary> {
      if (!tx) return deps.db.transaction((t) => service.create(input, t, actor));
      if (await deps.usersRepo.findIdByEmail(input.email, tx)) {
        throw new ConflictError(`A user with the e-mail ${input.email} already exists.`, 'EMAIL_TAKEN');
      }
      const customerId = input.role === 'customer' ? (input.customerId ?? null) : null;
      if (customerId && !(await deps.customersRepo.exists(customerId, tx))) {
        throw new ValidationError([{ path: ['body', 'customerId'], message: 'No customer organisation has this id.' }]);
      }
      const password = input.password ?? crypto.randomBytes(24).toString('base64url');
      const now = deps.clock();
      const id = await deps.usersRepo.createWithPassword(
        { name: input.name, email: input.email, role: input.role, customerId, passwordHash: await hashPassword(deps.auth, password), now },
        tx,
      );
      const found = await deps.usersRepo.findSummary(id, tx);
      if (!found) throw new Error('The new user was not found after creation.');
      await recordAudit(tx, { actor, action: 'create', entity: 'user', entityId: id, after: found, at: now });
      return found;
    },
  };
  return service;
}
export type UsersService = ReturnType<typeof createUsersService>;
