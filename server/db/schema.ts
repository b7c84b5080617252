import { sql } from 'drizzle-orm';
import { boolean, index, integer, json, pgEnum, pgTable, serial, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/pg-core';
import { ROLES } from '../../src/contracts/roles';
import { LENGTH_UNITS, TEMPERATURE_UNITS } from '../../src/contracts/auth';

export const roleEnum = pgEnum('role', ROLES);
export const lengthUnitEnum = pgEnum('length_unit', LENGTH_UNITS);
export const temperatureUnitEnum = pgEnum('temperature_unit', TEMPERATURE_UNITS);

const timestamps = {
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
};

/** Customer companies. The orders issue adds contacts, addresses and the rest. */
export const customers = pgTable(
  'customers',
  {
    id: serial('id').primaryKey(),
    name: varchar('name', { length: 160 }).notNull(),
    notes: text('notes').notNull().default(''),
    ...timestamps,
  },
  (t) => [uniqueIndex('customers_name_unique').on(sql`lower(${t.name})`)],
);

export const users = pgTable(
  'users',
  {
    id: serial('id').primaryKey(),
    /** Stored lower-cased; unique regardless of case. */
    email: varchar('email', { length: 254 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    role: roleEnum('role').notNull(),
    passwordHash: text('password_hash').notNull(),
    active: boolean('active').notNull().default(true),
    customerId: integer('customer_id').references(() => customers.id, { onDelete: 'restrict' }),
    lengthUnit: lengthUnitEnum('length_unit').notNull().default('mm'),
    temperatureUnit: temperatureUnitEnum('temperature_unit').notNull().default('C'),
    lastLoginAt: timestamp('last_login_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [uniqueIndex('users_email_unique').on(sql`lower(${t.email})`), index('users_customer_idx').on(t.customerId)],
);

/** Sessions, in the table layout connect-pg-simple reads and writes. */
export const sessions = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);

/** Small facts about this installation (for example which seed steps have run). */
export const appMeta = pgTable('app_meta', {
  key: varchar('key', { length: 80 }).primaryKey(),
  value: text('value').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
