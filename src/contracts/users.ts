import { z } from 'zod';
import { ROLES } from './roles';
import { LENGTH_UNITS, TEMPERATURE_UNITS } from './auth';

export const PASSWORD_MIN = 10;

const password = z
  .string()
  .min(PASSWORD_MIN, `At least ${PASSWORD_MIN} characters`)
  .max(200, 'At most 200 characters');

/** POST /api/auth/password — a signed-in user chooses a new password. */
export const changePasswordRequest = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password'),
    newPassword: password,
  })
  .refine((v) => v.newPassword !== v.currentPassword, { path: ['newPassword'], message: 'Choose a password different from the current one' });
export type ChangePasswordRequest = z.infer<typeof changePasswordRequest>;

/** The first admin of an empty installation (`npm run setup`). */
export const firstAdminInput = z.object({
  email: z.string().trim().toLowerCase().email('Not an e-mail address').max(254),
  name: z.string().trim().min(1, 'Enter a name').max(120),
  password,
});
export type FirstAdminInput = z.infer<typeof firstAdminInput>;

export const userRecord = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  active: z.boolean(),
  customerId: z.number().int().nullable(),
  customerName: z.string().nullable(),
  lengthUnit: z.enum(LENGTH_UNITS),
  temperatureUnit: z.enum(TEMPERATURE_UNITS),
  createdAt: z.string(),
  lastLoginAt: z.string().nullable(),
});
export type UserRecord = z.infer<typeof userRecord>;

export const createUserRequest = z
  .object({
    email: z.string().trim().toLowerCase().email('Not an e-mail address').max(254),
    name: z.string().trim().min(1, 'Enter a name').max(120),
    role: z.enum(ROLES, { message: `One of: ${ROLES.join(', ')}` }),
    password,
    customerId: z.number().int().positive().nullable().optional(),
  })
  .superRefine((v, ctx) => {
    if (v.role === 'customer' && !v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'A customer user belongs to a customer company' });
    }
    if (v.role !== 'customer' && v.customerId) {
      ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Only customer users belong to a customer company' });
    }
  });
export type CreateUserRequest = z.infer<typeof createUserRequest>;

export const updateUserRequest = z
  .object({
    name: z.string().trim().min(1, 'Enter a name').max(120),
    role: z.enum(ROLES, { message: `One of: ${ROLES.join(', ')}` }),
    active: z.boolean(),
    password,
    customerId: z.number().int().positive().nullable(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateUserRequest = z.infer<typeof updateUserRequest>;

/** What a signed-in user may change about themselves. */
export const updatePreferencesRequest = z
  .object({
    lengthUnit: z.enum(LENGTH_UNITS),
    temperatureUnit: z.enum(TEMPERATURE_UNITS),
  })
  .partial();
export type UpdatePreferencesRequest = z.infer<typeof updatePreferencesRequest>;

export const customerOption = z.object({ id: z.number().int(), name: z.string() });
export type CustomerOption = z.infer<typeof customerOption>;
