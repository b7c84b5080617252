import { eq } from 'drizzle-orm';
import { ROLES, type Role } from '../../src/contracts/roles';
import type { Db } from '../db/client';
import { appMeta, customers, users } from '../db/schema';
import { hashPassword } from '../users/service';
import { getShopSettings, setShopSetting, SHOP_DEFAULTS } from '../settings/service';
import { demoOrdersStep } from './orders';
import { demoBuildSheetsStep } from './build-sheets';
import { demoFloorStep } from './floor';
import { demoShippedHistoryStep } from './history';
import { demoTestRecordsStep } from './test-records';
import { demoCustomerUsersStep, demoShipmentsStep } from './shipments';

/** The demo sign-ins: `<role>@spoolwright.test`, one per role, all with this password. */
export const DEMO_PASSWORD = 'spoolwright-demo';
export const demoEmail = (role: Role) => `${role}@spoolwright.test`;

/** Invented people for the demo shop (no real persons). */
const DEMO_NAMES: Record<Role, string> = {
  admin: 'Imogen Varley',
  office: 'Tobias Quennell',
  engineer: 'Priya Lindqvist',
  foreman: 'Rufus Okonjo',
  floor: 'Mara Delacroix-Hale',
  shipping: 'Dev Castellan',
  customer: 'Ottilie Brannagh',
};

/** The invented company the demo customer user buys for. */
export const DEMO_CUSTOMER_COMPANY = 'Pellridge Valve Systems';

type Step = { id: string; run: (tx: Db) => Promise<void> };

/** The invented shop the demo plays. */
export const DEMO_SHOP_NAME = 'Larkspur Coil Works';
const demoShopStep: Step = {
  id: 'demo-shop',
  async run(db) {
    if ((await getShopSettings(db)).name !== SHOP_DEFAULTS.name) return;
    await setShopSetting(db, 'name', DEMO_SHOP_NAME);
  },
};

/**
 * Seed steps, each run once per database and recorded in app_meta. A step never touches a
 * database that already has data of its kind, so real data is never overwritten. Later features
 * append steps here.
 */
export const SEED_STEPS: Step[] = [
  {
    id: 'demo-users',
    async run(db) {
      const existing = await db.select({ id: users.id }).from(users).limit(1);
      if (existing.length) return; // a real installation: leave it alone
      const passwordHash = await hashPassword(DEMO_PASSWORD);
      const [company] = await db.insert(customers).values({ name: DEMO_CUSTOMER_COMPANY, notes: 'Demo customer' }).returning();
      await db.insert(users).values(
        ROLES.map((role) => ({
          email: demoEmail(role),
          name: DEMO_NAMES[role],
          role,
          passwordHash,
          customerId: role === 'customer' ? company.id : null,
          lengthUnit: role === 'customer' ? ('in' as const) : ('mm' as const),
        })),
      );
    },
  },
  // Customers with contacts, orders in every status and a few drawings (server/seed/orders.ts).
  // The demo shop's own name on travelers and e-mail (kept if the shop already set one).
  demoShopStep,
  demoOrdersStep,
  // Spools, build sheets drafted, approved and released to work orders (server/seed/build-sheets.ts).
  demoBuildSheetsStep,
  // Stations, five floor staff, work orders assigned and moved along the stages (server/seed/floor.ts).
  demoFloorStep,
  // Work orders of closed orders that shipped before shipments were recorded here (server/seed/history.ts).
  demoShippedHistoryStep,
  // Instruments, and unit tests of the work orders in testing, inspection and rework (server/seed/test-records.ts).
  demoTestRecordsStep,
  // Past shipments of the shipped and partly shipped orders, through the shipments service, and
  // customer users for a few more companies (server/seed/shipments.ts).
  demoShipmentsStep,
  demoCustomerUsersStep,
];

/** Runs the steps not yet recorded, each in its own transaction with its record. */
export async function seed(db: Db, log: (m: string) => void = () => {}) {
  for (const step of SEED_STEPS) {
    const key = `seed:${step.id}`;
    const done = await db.query.appMeta.findFirst({ where: eq(appMeta.key, key) });
    if (done) continue;
    await db.transaction(async (tx) => {
      await step.run(tx as unknown as Db);
      await tx.insert(appMeta).values({ key, value: new Date().toISOString() });
    });
    log(`seeded ${step.id}`);
  }
}
