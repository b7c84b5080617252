/**
 * API contract of customer companies and their contacts. Imports nothing but zod.
 */
import { z } from 'zod';

/** Largest id the database holds (PostgreSQL integer). */
const ID_MAX = 2_147_483_647;

const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);

/** A postal address. Every part may be empty while unknown; one that is filled in needs a street, town and country. */
export const addressSchema = z
  .object({
    line1: text(160, 'Street and number').default(''),
    line2: text(160, 'Second address line').default(''),
    city: text(100, 'Town or city').default(''),
    region: text(100, 'Region or state').default(''),
    postalCode: text(20, 'Postal code').default(''),
    country: text(80, 'Country').default(''),
  })
  .superRefine((a, ctx) => {
    const filled = Object.values(a).some((v) => v !== '');
    if (!filled) return;
    if (!a.line1) ctx.addIssue({ code: 'custom', path: ['line1'], message: 'Enter the street and number' });
    if (!a.city) ctx.addIssue({ code: 'custom', path: ['city'], message: 'Enter the town or city' });
    if (!a.country) ctx.addIssue({ code: 'custom', path: ['country'], message: 'Enter the country' });
  });
export type Address = z.infer<typeof addressSchema>;
export const EMPTY_ADDRESS: Address = { line1: '', line2: '', city: '', region: '', postalCode: '', country: '' };

export const contactInput = z
  .object({
    /** Present when changing an existing contact; absent for a new one. */
    id: z.int({ error: 'Contact: an id' }).positive('Contact: an id').max(ID_MAX, 'Contact: an id').optional(),
    name: text(120, 'Name').min(1, 'Enter the contact’s name'),
    email: z
      .string()
      .trim()
      .toLowerCase()
      .max(254, 'E-mail address: at most 254 characters')
      .refine((v) => v === '' || z.email().safeParse(v).success, 'Not an e-mail address')
      .default(''),
    phone: text(40, 'Phone').default(''),
    /** Receives order acknowledgements and release notices. */
    notifyOrders: z.boolean().default(false),
    /** Receives shipment notices. */
    notifyShipping: z.boolean().default(false),
  })
  .superRefine((c, ctx) => {
    if ((c.notifyOrders || c.notifyShipping) && !c.email) {
      ctx.addIssue({ code: 'custom', path: ['email'], message: 'A contact who gets notices needs an e-mail address' });
    }
  });
export type ContactInput = z.input<typeof contactInput>;

const contactList = z.array(contactInput).max(30, 'At most 30 contacts').default([]);

export const createCustomerRequest = z.object({
  name: text(160, 'Company name').min(1, 'Enter the company name'),
  /** Internal notes; never shown to the customer. */
  notes: text(4000, 'Notes').default(''),
  billingAddress: addressSchema.default(EMPTY_ADDRESS),
  /** null: ship to the billing address. */
  shippingAddress: addressSchema.nullable().default(null),
  contacts: contactList,
});
export type CreateCustomerRequest = z.infer<typeof createCustomerRequest>;

/**
 * A change to a customer. `contacts`, when given, is the whole new list: entries with an `id`
 * change that contact, entries without one are added, contacts left out are removed.
 */
export const updateCustomerRequest = z
  .object({
    name: text(160, 'Company name').min(1, 'Enter the company name'),
    notes: text(4000, 'Notes'),
    billingAddress: addressSchema,
    shippingAddress: addressSchema.nullable(),
    contacts: z.array(contactInput).max(30, 'At most 30 contacts'),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateCustomerRequest = z.infer<typeof updateCustomerRequest>;

export const listCustomersQuery = z.object({
  /** Matches the company name, a contact's name or e-mail, or the billing town (any case). */
  q: text(100, 'Search').optional(),
});
export type ListCustomersQuery = z.infer<typeof listCustomersQuery>;

export const contactRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string(),
  phone: z.string(),
  notifyOrders: z.boolean(),
  notifyShipping: z.boolean(),
});
export type ContactRecord = z.infer<typeof contactRecord>;

export const customerSummary = z.object({
  id: z.number().int(),
  name: z.string(),
  city: z.string(),
  country: z.string(),
  contactCount: z.number().int(),
  orderCount: z.number().int(),
  openOrderCount: z.number().int(),
});
export type CustomerSummary = z.infer<typeof customerSummary>;

/** One of the company's orders, as the customer detail lists them. */
export const customerOrderRow = z.object({
  id: z.number().int(),
  number: z.string(),
  purchaseOrder: z.string(),
  status: z.string(),
  orderDate: z.string(),
  dueDate: z.string(),
  late: z.boolean(),
});

export const customerDetail = z.object({
  id: z.number().int(),
  name: z.string(),
  /** Absent for customer-role readers (internal). */
  notes: z.string().optional(),
  billingAddress: addressSchema,
  shippingAddress: addressSchema.nullable(),
  contacts: z.array(contactRecord),
  orders: z.array(customerOrderRow),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type CustomerDetail = z.infer<typeof customerDetail>;
