import { z } from 'zod';
import { roleSchema } from './roles';
import { labPublicSchema } from './lab.schema';

/**
 * The signed-in user as the API reports it. `role` is null for an account that has no role yet
 * (only possible when public sign-up is enabled): such an account can sign in but every guarded
 * route answers 403 until an admin gives it a role.
 */
export const sessionUserSchema = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  role: roleSchema.nullable(),
  customerId: z.string().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** `GET /api/me`. */
export const meSchema = z.object({
  user: sessionUserSchema,
  lab: labPublicSchema,
});
export type Me = z.infer<typeof meSchema>;
