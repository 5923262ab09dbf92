import { z } from 'zod';

const text = (what: string, max = 200) => z.string({ error: `Enter the ${what}.` }).trim().min(1, `Enter the ${what}.`).max(max, `The ${what} is longer than ${max} characters.`);
const optionalText = (what: string, max = 200) => z.string({ error: `The ${what} must be text.` }).trim().max(max, `The ${what} is longer than ${max} characters.`).default('');

/** Body of POST/PUT /api/customers. */
export const customerInputSchema = z.object({
  organisation: text('organisation name'),
  address: optionalText('address', 1000),
});
export type CustomerInput = z.input<typeof customerInputSchema>;

/** A person at the customer; `receivesCertificates` marks who gets issued certificates by e-mail. */
export const contactInputSchema = z.object({
  name: text('contact name'),
  email: z.email('Enter a valid e-mail address.').transform((e) => e.toLowerCase()),
  receivesCertificates: z.boolean({ error: 'Say whether this contact receives certificates.' }).default(true),
});
export type ContactInput = z.input<typeof contactInputSchema>;

/** An instrument of the customer's sent for calibration. */
export const itemInputSchema = z.object({
  description: text('description'),
  maker: optionalText('maker'),
  model: optionalText('model'),
  serialNumber: text('serial number', 100),
  notes: optionalText('notes', 2000),
});
export type ItemInput = z.input<typeof itemInputSchema>;

export const contactSchema = z.object({
  id: z.string(),
  customerId: z.string(),
  name: z.string(),
  email: z.string(),
  receivesCertificates: z.boolean(),
});
export type Contact = z.infer<typeof contactSchema>;

export const itemSchema = z.object({
  id: z.string(),
  customerId: z.string(),
  customerName: z.string(),
  description: z.string(),
  maker: z.string(),
  model: z.string(),
  serialNumber: z.string(),
  notes: z.string(),
  /** One line for lists and pickers: "description, maker model, s/n …". */
  label: z.string(),
});
export type Item = z.infer<typeof itemSchema>;

export const customerSummarySchema = z.object({
  id: z.string(),
  organisation: z.string(),
  address: z.string(),
  contactCount: z.number(),
  itemCount: z.number(),
});
export type CustomerSummary = z.infer<typeof customerSummarySchema>;

export const customerDetailSchema = z.object({
  id: z.string(),
  organisation: z.string(),
  address: z.string(),
  contacts: z.array(contactSchema),
  items: z.array(itemSchema),
});
export type CustomerDetail = z.infer<typeof customerDetailSchema>;

export const customerListSchema = z.object({ customers: z.array(customerSummarySchema) });
export const customerResponseSchema = z.object({ customer: customerDetailSchema });
export const itemListSchema = z.object({ items: z.array(itemSchema) });

/** The one-line name of an item. */
export function itemLabel(i: { description: string; maker: string; model: string; serialNumber: string }): string {
  const makerModel = [i.maker, i.model].filter(Boolean).join(' ');
  return [i.description, makerModel, `s/n ${i.serialNumber}`].filter(Boolean).join(', ');
}
