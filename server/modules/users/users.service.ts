import crypto from 'node:crypto';
import type { Auth } from '../../auth/auth';
import type { Db } from '../../db/client';
import { recordAudit, type AuditActor } from '../../audit';
import { ConflictError, NotFoundError, ValidationError } from '../../errors/app-error';
import type { Outbox } from '../../mail/outbox';
import {
  INVITATION_VALID_HOURS,
  type AcceptInvitationInput,
  type CreateUserInput,
  type InvitationInfo,
  type UpdateUserInput,
  type UserSummary,
} from '../../../shared/schemas/users.schema';
import { ROLE_LABELS } from '../../../shared/schemas/roles';
import type { CustomersRepository } from '../customers/customers.repository';
import type { UsersRepository } from './users.repository';

/** Hashes a password with better-auth's own hasher, so better-auth can verify it at sign-in. */
export async function hashPassword(auth: Auth, password: string): Promise<string> {
  const ctx = await auth.$context;
  return ctx.password.hash(password);
}

const sha256 = (s: string) => crypto.createHash('sha256').update(s).digest('hex');

export class LastAdminError extends ConflictError {
  constructor(what: string) {
    super(`This is the last active administrator: it cannot be ${what}. Make another user an administrator first.`, 'LAST_ADMIN');
  }
}

export function createUsersService(deps: {
  db: Db;
  usersRepo: UsersRepository;
  customersRepo: CustomersRepository;
  auth: Auth;
  clock: () => Date;
  /** Needed for invitations and resets (the seed creates users without it). */
  outbox?: Outbox;
  baseUrl?: string;
  /** The lab's name for the e-mail; reads inside the given transaction. */
  labName?: (tx: Db) => Promise<string>;
}) {
  const repo = deps.usersRepo;

  async function mustFind(id: string, tx: Db): Promise<UserSummary> {
    const found = await repo.findSummary(id, tx);
    if (!found) throw new NotFoundError('No user has this id.');
    return found;
  }

  async function checkCustomer(customerId: string | null, tx: Db) {
    if (customerId && !(await deps.customersRepo.exists(customerId, tx))) {
      throw new ValidationError([{ path: ['body', 'customerId'], message: 'No customer organisation has this id.' }]);
    }
  }

  /** Refuses a change that would leave no active administrator. */
  async function keepAnAdmin(target: UserSummary, what: string, tx: Db) {
    const admins = await repo.lockActiveAdminIds(tx);
    if (target.role === 'admin' && target.active && admins.length === 1 && admins[0] === target.id) throw new LastAdminError(what);
  }

  /**
   * Writes a fresh one-time link (only the SHA-256 of the token is stored; any earlier link of the
   * user stops working) and queues the e-mail in the same transaction.
   */
  async function sendLink(u: UserSummary, kind: 'invitation' | 'reset', tx: Db) {
    if (!deps.outbox || !deps.baseUrl) throw new Error('The users service needs the outbox and the base URL to send links.');
    const token = crypto.randomBytes(32).toString('base64url');
    const now = deps.clock();
    const expiresAt = new Date(now.getTime() + INVITATION_VALID_HOURS * 3_600_000);
    await repo.putInvitation(u.id, sha256(token), expiresAt, now, tx);
    const link = `${deps.baseUrl}/set-password?token=${encodeURIComponent(token)}`;
    const lab = deps.labName ? await deps.labName(tx) : 'the calibration laboratory';
    const subject = kind === 'invitation' ? `Your Emberline account at ${lab}` : `Set a new Emberline password (${lab})`;
    const opening =
      kind === 'invitation'
        ? `An administrator at ${lab} has created an Emberline account for you (${ROLE_LABELS[u.role ?? 'analyst']}).`
        : `An administrator at ${lab} has reset the password of your Emberline account.`;
    const text = [
      `Hello ${u.name},`,
      '',
      opening,
      'Choose your password with this link (it works once and expires in ' + `${INVITATION_VALID_HOURS} hours):`,
      '',
      link,
      '',
      `Your sign-in e-mail is ${u.email}.`,
      'If you did not expect this message, ignore it.',
    ].join('\n');
    await deps.outbox.enqueue({ to: [u.email], subject, text }, tx);
    return { expiresAt };
  }

  const service = {
    list(): Promise<UserSummary[]> {
      return repo.list();
    },

    async get(id: string): Promise<UserSummary> {
      return mustFind(id, deps.db);
    },

    /**
     * Creates a user with a role, server-side (public sign-up stays off). Without a password the
     * account gets a long random one nobody knows and, when the outbox is wired, the person gets
     * an invitation e-mail with a one-time link to choose theirs.
     */
    async create(input: CreateUserInput, tx?: Db, actor: AuditActor | null = null): Promise<UserSummary> {
      if (!tx) return deps.db.transaction((t) => service.create(input, t, actor));
      if (await repo.findIdByEmail(input.email, tx)) {
        throw new ConflictError(`A user with the e-mail ${input.email} already exists.`, 'EMAIL_TAKEN');
      }
      const customerId = input.role === 'customer' ? (input.customerId ?? null) : null;
      await checkCustomer(customerId, tx);
      const password = input.password ?? crypto.randomBytes(24).toString('base64url');
      const now = deps.clock();
      const id = await repo.createWithPassword(
        { name: input.name, email: input.email, role: input.role, customerId, passwordHash: await hashPassword(deps.auth, password), now },
        tx,
      );
      let found = await repo.findSummary(id, tx);
      if (!found) throw new Error('The new user was not found after creation.');
      await recordAudit(tx, { actor, action: 'create', entity: 'user', entityId: id, after: found, at: now });
      if (!input.password && deps.outbox) {
        const { expiresAt } = await sendLink(found, 'invitation', tx);
        await recordAudit(tx, { actor, action: 'invite', entity: 'user', entityId: id, after: { email: found.email, linkExpiresAt: expiresAt }, at: now });
        found = (await repo.findSummary(id, tx))!;
      }
      return found;
    },

    /** Name, role and customer. Demoting the last active admin is refused (409). */
    update(id: string, input: UpdateUserInput, actor: AuditActor | null): Promise<UserSummary> {
      return deps.db.transaction(async (tx) => {
        const before = await mustFind(id, tx);
        if (input.role !== 'admin') await keepAnAdmin(before, 'given another role', tx);
        const customerId = input.role === 'customer' ? (input.customerId ?? null) : null;
        await checkCustomer(customerId, tx);
        const now = deps.clock();
        await repo.update(id, { name: input.name, role: input.role, customerId }, now, tx);
        // A new role takes effect at once: sessions carry the old one until they are renewed.
        if (before.role !== input.role || before.customerId !== customerId) await repo.revokeSessions(id, tx);
        const after = await mustFind(id, tx);
        await recordAudit(tx, { actor, action: 'update', entity: 'user', entityId: id, before, after, at: now });
        return after;
      });
    },

    /** Blocks sign-in and ends every session; the last active admin cannot be deactivated (409). */
    deactivate(id: string, actor: AuditActor | null): Promise<UserSummary> {
      return deps.db.transaction(async (tx) => {
        const before = await mustFind(id, tx);
        if (!before.active) throw new ConflictError('This user is already deactivated.', 'ALREADY_DEACTIVATED');
        await keepAnAdmin(before, 'deactivated', tx);
        const now = deps.clock();
        await repo.setDeactivated(id, now, now, tx);
        await repo.revokeSessions(id, tx);
        await repo.dropInvitations(id, tx);
        const after = await mustFind(id, tx);
        await recordAudit(tx, { actor, action: 'deactivate', entity: 'user', entityId: id, before, after, at: now });
        return after;
      });
    },

    reactivate(id: string, actor: AuditActor | null): Promise<UserSummary> {
      return deps.db.transaction(async (tx) => {
        const before = await mustFind(id, tx);
        if (before.active) throw new ConflictError('This user is already active.', 'ALREADY_ACTIVE');
        const now = deps.clock();
        await repo.setDeactivated(id, null, now, tx);
        const after = await mustFind(id, tx);
        await recordAudit(tx, { actor, action: 'reactivate', entity: 'user', entityId: id, before, after, at: now });
        return after;
      });
    },

    /**
     * Resets the password: the old one stops working at once (replaced by a random one), every
     * session ends, and the person gets a new one-time link by e-mail.
     */
    resetPassword(id: string, actor: AuditActor | null): Promise<UserSummary> {
      return deps.db.transaction(async (tx) => {
        const u = await mustFind(id, tx);
        if (!u.active) throw new ConflictError('This user is deactivated: reactivate the account before resetting its password.', 'DEACTIVATED');
        const now = deps.clock();
        await repo.setPassword(id, await hashPassword(deps.auth, crypto.randomBytes(24).toString('base64url')), now, tx);
        await repo.revokeSessions(id, tx);
        const { expiresAt } = await sendLink(u, 'reset', tx);
        await recordAudit(tx, { actor, action: 'reset_password', entity: 'user', entityId: id, after: { email: u.email, linkExpiresAt: expiresAt }, at: now });
        return mustFind(id, tx);
      });
    },

    /** Who a link is for; 404 when the link is unknown, used or expired. */
    async invitation(token: string): Promise<InvitationInfo> {
      const inv = await repo.findInvitation(sha256(token), deps.clock());
      const u = inv ? await repo.findSummary(inv.userId) : null;
      if (!inv || !u || !u.active) throw new NotFoundError('This link is not valid any more: it was used already or has expired. Ask an administrator for a new one.');
      return { name: u.name, email: u.email, expiresAt: inv.expiresAt.toISOString() };
    },

    /** Sets the password from a one-time link; the link is used up in the same transaction. */
    acceptInvitation(input: AcceptInvitationInput): Promise<{ email: string }> {
      return deps.db.transaction(async (tx) => {
        const now = deps.clock();
        const inv = await repo.findInvitation(sha256(input.token), now, tx);
        const u = inv ? await repo.findSummary(inv.userId, tx) : null;
        if (!inv || !u || !u.active || !(await repo.consumeInvitation(inv.id, tx))) {
          throw new NotFoundError('This link is not valid any more: it was used already or has expired. Ask an administrator for a new one.');
        }
        await repo.setPassword(u.id, await hashPassword(deps.auth, input.password), now, tx);
        await repo.revokeSessions(u.id, tx);
        await recordAudit(tx, { actor: { id: u.id, name: u.name, role: u.role }, action: 'set_password', entity: 'user', entityId: u.id, at: now });
        return { email: u.email };
      });
    },
  };
  return service;
}
export type UsersService = ReturnType<typeof createUsersService>;
