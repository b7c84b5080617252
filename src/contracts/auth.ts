import { z } from 'zod';
import { ROLES } from './roles';

export const LENGTH_UNITS = ['mm', 'in'] as const;
export const TEMPERATURE_UNITS = ['C', 'F'] as const;

export const unitPreferences = z.object({
  lengthUnit: z.enum(LENGTH_UNITS),
  temperatureUnit: z.enum(TEMPERATURE_UNITS),
});
export type UnitPreferences = z.infer<typeof unitPreferences>;

export const loginRequest = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').email('Not an e-mail address'),
  password: z.string().min(1, 'Enter your password'),
});
export type LoginRequest = z.infer<typeof loginRequest>;

export const sessionUser = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  customerId: z.number().int().nullable(),
  lengthUnit: z.enum(LENGTH_UNITS),
  temperatureUnit: z.enum(TEMPERATURE_UNITS),
  /** true until the user chooses their own password (the first admin): every other route answers 403 `password_change_required`. */
  mustChangePassword: z.boolean().optional(),
  /** Present when the request came with an API token: it acts in the token's role on behalf of the admin who issued it. */
  token: z.object({ id: z.number().int(), name: z.string() }).optional(),
});
export type SessionUser = z.infer<typeof sessionUser>;

export const sessionResponse = z.object({ user: sessionUser });
export type SessionResponse = z.infer<typeof sessionResponse>;
