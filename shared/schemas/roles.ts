import { z } from 'zod';

/**
 * The five roles of Emberline. The role lives on the server (column `user.role`) and is never
 * taken from a request body; see server/auth.
 */
export const ROLES = ['admin', 'quality_manager', 'analyst', 'signatory', 'customer'] as const;

export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/** Roles that belong to lab staff (everyone except the customer). */
export const STAFF_ROLES = ['admin', 'quality_manager', 'analyst', 'signatory'] as const satisfies readonly Role[];

/** Words shown to people for each role. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  quality_manager: 'Quality manager',
  analyst: 'Analyst',
  signatory: 'Authorised signatory',
  customer: 'Customer',
};
