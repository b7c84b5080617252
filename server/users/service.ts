import bcrypt from 'bcryptjs';
import { and, eq, sql } from 'drizzle-orm';
import type { SessionUser } from '../../src/contracts/auth';
import type { ChangePasswordRequest, CreateUserRequest, FirstAdminInput, UpdatePreferencesRequest, UpdateUserRequest, UserRecord } from '../../src/contracts/users';
import type { Db } from '../db/client';
import { users } from '../db/schema';
import { HttpError, notFound, ruleBroken } from '../http/errors';
import * as repo from './repository';

/** bcrypt cost: 2^12 rounds, about a quarter second here — slow enough to resist guessing. */
export const BCRYPT_COST = 12;

export const hashPassword = (plain: string) => bcrypt.hash(plain, BCRYPT_COST);

export function toSessionUser(u: repo.UserRow): SessionUser {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    customerId: u.customerId,
    lengthUnit: u.lengthUnit,
    temperatureUnit: u.temperatureUnit,
    ...(u.mustChangePassword && { mustChangePassword: true }),
  };
}

function toRecord(u: repo.UserRow, customerName: string | null): UserRecord {
  return {
    ...toSessionUser(u),
    active: u.active,
    customerName,
    createdAt: u.createdAt.toISOString(),
    lastLoginAt: u.lastLoginAt?.toISOString() ?? null,
  };
}

// A fixed hash to compare against when the e-mail is unknown, so both failures take equal time.
const NO_SUCH_USER_HASH = bcrypt.hashSync('no such user', BCRYPT_COST);

/** Checks a sign-in pair. Returns the user, or null for any bad pair (one answer for both cases). */
export async function verifyCredentials(db: Db, email: string, password: string): Promise<SessionUser | null> {
  const user = await repo.findUserByEmail(db, email);
  const ok = await bcrypt.compare(password, user?.passwordHash ?? NO_SUCH_USER_HASH);
  if (!user || !ok || !user.active) return null;
  await db.update(users).set({ lastLoginAt: new Date() }).where(eq(users.id, user.id));
  return toSessionUser(user);
}

/** The session's user as stored now; null when gone or deactivated (the session then ends). */
export async function loadSessionUser(db: Db, id: number): Promise<SessionUser | null> {
  const user = await repo.findUserById(db, id);
  return user && user.active ? toSessionUser(user) : null;
}

export async function listUsers(db: Db): Promise<UserRecord[]> {
  const rows = await repo.listUsersWithCompany(db);
  return rows.map((r) => toRecord(r.user, r.customerName));
}

export function listCustomerOptions(db: Db) {
  return repo.listCustomerOptions(db);
}

async function getRecord(db: Db, id: number) {
  const rows = await repo.listUsersWithCompany(db);
  const row = rows.find((r) => r.user.id === id);
  if (!row) throw notFound('No such user');
  return toRecord(row.user, row.customerName);
}

export async function createUser(db: Db, input: CreateUserRequest): Promise<UserRecord> {
  if (input.customerId && !(await repo.customerExists(db, input.customerId))) {
    throw new HttpError(400, 'validation', 'No such customer company', { customerId: 'No such customer company' });
  }
  if (await repo.findUserByEmail(db, input.email)) {
    throw new HttpError(409, 'conflict', 'A user with this e-mail address exists already', { email: 'Already in use' });
  }
  const passwordHash = await hashPassword(input.password);
  try {
    const [row] = await db
      .insert(users)
      .values({ email: input.email, name: input.name, role: input.role, passwordHash, customerId: input.customerId ?? null })
      .returning({ id: users.id });
    return getRecord(db, row.id);
  } catch (e) {
    // Two admins creating the same address at once: the unique index decides.
    if ((e as { cause?: { code?: string } }).cause?.code === '23505' || (e as { code?: string }).code === '23505') {
      throw new HttpError(409, 'conflict', 'A user with this e-mail address exists already', { email: 'Already in use' });
    }
    throw e;
  }
}

/**
 * Changes a user's name, role, active flag, company or password. The last active admin can be
 * neither demoted nor deactivated; admins are locked while that is checked, so two admins
 * demoting each other at once cannot leave the shop without one.
 */
export async function updateUser(db: Db, id: number, input: UpdateUserRequest, actorId: number): Promise<UserRecord> {
  const passwordHash = input.password ? await hashPassword(input.password) : undefined;
  await db.transaction(async (tx) => {
    const admins = await repo.lockActiveAdmins(tx);
    const user = await repo.findUserById(tx, id);
    if (!user) throw notFound('No such user');
    const role = input.role ?? user.role;
    const customerId = input.customerId !== undefined ? input.customerId : user.customerId;
    const active = input.active ?? user.active;
    const losesAdmin = user.role === 'admin' && user.active && (role !== 'admin' || !active);
    if (losesAdmin && admins.length <= 1) {
      throw ruleBroken('The shop must keep at least one active admin', {
        [input.active === false ? 'active' : 'role']: 'This is the last active admin',
      });
    }
    if (role === 'customer' && !customerId) {
      throw new HttpError(400, 'validation', 'A customer user belongs to a customer company', { customerId: 'Choose the customer company' });
    }
    if (role !== 'customer' && customerId) {
      throw new HttpError(400, 'validation', 'Only customer users belong to a customer company', { customerId: 'Leave empty for shop staff' });
    }
    if (customerId && !(await repo.customerExists(tx, customerId))) {
      throw new HttpError(400, 'validation', 'No such customer company', { customerId: 'No such customer company' });
    }
    if (id === actorId && !active) throw ruleBroken('You cannot deactivate yourself', { active: 'Ask another admin' });
    await tx
      .update(users)
      .set({ name: input.name ?? user.name, role, customerId, active, ...(passwordHash && { passwordHash }), updatedAt: new Date() })
      .where(eq(users.id, id));
    if (!active || passwordHash || role !== user.role) await repo.deleteSessionsOf(tx, id);
  });
  return getRecord(db, id);
}

export async function updatePreferences(db: Db, id: number, input: UpdatePreferencesRequest): Promise<SessionUser> {
  const [row] = await db.update(users).set({ ...input, updatedAt: new Date() }).where(eq(users.id, id)).returning();
  if (!row) throw notFound('No such user');
  return toSessionUser(row);
}

/**
 * The first admin of an installation (`npm run setup`): refused when any admin exists already.
 * The password was chosen by whoever ran the set-up, so the first sign-in must change it.
 * A transaction-scoped advisory lock keeps two set-ups at once from both creating one.
 */
export async function createFirstAdmin(db: Db, input: FirstAdminInput): Promise<SessionUser> {
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('spoolwright.first-admin'))`);
    const [existing] = await tx.select({ email: users.email }).from(users).where(eq(users.role, 'admin')).limit(1);
    if (existing) throw new HttpError(409, 'conflict', `An admin exists already (${existing.email}); sign in as that admin to add users`);
    if (await repo.findUserByEmail(tx, input.email)) {
      throw new HttpError(409, 'conflict', 'A user with this e-mail address exists already', { email: 'Already in use' });
    }
    const [row] = await tx
      .insert(users)
      .values({ email: input.email, name: input.name, role: 'admin', passwordHash, mustChangePassword: true })
      .returning();
    return toSessionUser(row);
  });
}

/** A signed-in user changes their own password (the current one is checked); clears the forced change and ends their other sessions. */
export async function changeOwnPassword(db: Db, id: number, input: ChangePasswordRequest, keepSessionId?: string): Promise<SessionUser> {
  const user = await repo.findUserById(db, id);
  if (!user || !user.active) throw notFound('No such user');
  if (!(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
    throw new HttpError(400, 'validation', 'The current password is not right', { currentPassword: 'Not right' });
  }
  const passwordHash = await hashPassword(input.newPassword);
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: false, updatedAt: new Date() })
      .where(and(eq(users.id, id), eq(users.passwordHash, user.passwordHash)))
      .returning();
    if (!row) throw new HttpError(409, 'conflict', 'The password was changed meanwhile; sign in again');
    await repo.deleteSessionsOf(tx, id, keepSessionId);
    return toSessionUser(row);
  });
}
