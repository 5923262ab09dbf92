import { z } from 'zod';

/** The laboratory's own details (one row, edited by the admin). */
export const labSettingsSchema = z.object({
  name: z.string(),
  address: z.string(),
  accreditationNumber: z.string(),
  contactEmail: z.string(),
  contactPhone: z.string(),
});
export type LabSettings = z.infer<typeof labSettingsSchema>;

/** What anyone may read (landing page, verification page): no contact details beyond these. */
export const labPublicSchema = labSettingsSchema.pick({ name: true, address: true, accreditationNumber: true });
export type LabPublic = z.infer<typeof labPublicSchema>;

/** Body of `PUT /api/lab`. Every field required; empty names are refused. */
export const labSettingsInputSchema = z.object({
  name: z.string().trim().min(1, 'Enter the laboratory name.').max(200),
  address: z.string().trim().min(1, 'Enter the laboratory address.').max(1000),
  accreditationNumber: z.string().trim().max(100),
  contactEmail: z.union([z.literal(''), z.email('Enter a valid e-mail address.')]),
  contactPhone: z.string().trim().max(50),
});
export type LabSettingsInput = z.infer<typeof labSettingsInputSchema>;
