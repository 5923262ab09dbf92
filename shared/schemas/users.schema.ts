import { z } from 'zod';
import { roleSchema } from './roles';

/** A user as listed to the admin (`GET /api/users`). */
export const userSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  role: roleSchema.nullable(),
  customerId: z.string().nullable(),
  customerName: z.string().nullable(),
  createdAt: z.string(),
  /** False once an admin deactivated the account (no sign-in). */
  active: z.boolean(),
  deactivatedAt: z.string().nullable(),
  /** An invitation or reset link is outstanding (not used, not expired). */
  invitationPending: z.boolean(),
});
export type UserSummary = z.infer<typeof userSummarySchema>;

export const userListSchema = z.object({ users: z.array(userSummarySchema) });

export const PASSWORD_MIN_LENGTH = 10;

/**
 * Body of `POST /api/users` (admin). A customer user must name its customer organisation; staff
 * must not. Without a password the account gets a random one (issue 7 adds invitation e-mails).
 */
export const createUserInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter the name.').max(200),
    email: z.email('Enter a valid e-mail address.').transform((e) => e.toLowerCase()),
    role: roleSchema,
    customerId: z.uuid('Choose a customer organisation.').nullish(),
    password: z.string().min(PASSWORD_MIN_LENGTH, `The password needs at least ${PASSWORD_MIN_LENGTH} characters.`).max(128).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.role === 'customer' && !v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'A customer user must belong to a customer organisation.' });
    }
    if (v.role !== 'customer' && v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Only customer users belong to a customer organisation.' });
    }
  });
export type CreateUserInput = z.infer<typeof createUserInputSchema>;

/** Body of `PATCH /api/users/:id` (admin): change the name, the role or the customer organisation. */
export const updateUserInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter the name.').max(200),
    role: roleSchema,
    customerId: z.uuid('Choose a customer organisation.').nullish(),
  })
  .superRefine((v, ctx) => {
    if (v.role === 'customer' && !v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'A customer user must belong to a customer organisation.' });
    }
    if (v.role !== 'customer' && v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Only customer users belong to a customer organisation.' });
    }
  });
export type UpdateUserInput = z.infer<typeof updateUserInputSchema>;

/** How long an invitation or reset link stays valid. */
export const INVITATION_VALID_HOURS = 72;

/** `GET /api/invitations/:token`: who the link is for, so the page can greet them. */
export const invitationInfoSchema = z.object({ name: z.string(), email: z.string(), expiresAt: z.string() });
export type InvitationInfo = z.infer<typeof invitationInfoSchema>;

/** Body of `POST /api/invitations/accept`: the one-time token and the chosen password. */
export const acceptInvitationInputSchema = z.object({
  token: z.string().trim().min(20, 'The link is not complete: open it again from the e-mail.').max(200),
  password: z
    .string()
    .min(PASSWORD_MIN_LENGTH, `The password needs at least ${PASSWORD_MIN_LENGTH} characters.`)
    .max(128, 'The password can have at most 128 characters.'),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationInputSchema>;
