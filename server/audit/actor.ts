import type { SessionUser } from '../../shared/schemas/me.schema';
import type { AuditActor } from './record';

/** The audit actor for a signed-in user (`res.locals.user`); null stays null (the system). */
export function auditActor(user: Pick<SessionUser, 'id' | 'name' | 'role'> | null | undefined): AuditActor | null {
  return user ? { id: user.id, name: user.name, role: user.role } : null;
}
