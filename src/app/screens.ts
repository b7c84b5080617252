/**
 * Every screen a signed-in person can open: one row each, with the roles it is for.
 * The navigation is built from this table (in this order) and the router's role guard reads it,
 * so a screen is shown in the menu exactly when its route lets the role in. A new feature adds
 * its row here and its route in router.tsx. (The server decides for real; this only hides what
 * it would refuse.)
 */
import { ROLES, STAFF_ROLES, type Role } from '../contracts/roles';

export type ScreenId =
  | 'home'
  | 'orders'
  | 'orderNew'
  | 'order'
  | 'orderEdit'
  | 'customers'
  | 'customerNew'
  | 'customer'
  | 'customerEdit'
  | 'users'
  | 'outbox'
  | 'settings'
  | 'engineering'
  | 'engineeringLine'
  | 'spools'
  | 'floorBoard'
  | 'floorLoad'
  | 'myWork'
  | 'scan'
  | 'workOrder'
  | 'stations'
  | 'shippingReady'
  | 'shipmentNew'
  | 'shipments'
  | 'shipment'
  | 'portalOrders'
  | 'portalOrder'
  | 'portalShipments'
  | 'testBench'
  | 'workOrderTests'
  | 'quality'
  | 'designFeedback'
  | 'imports'
  | 'integrations';

/** Who reads orders (a customer only its own company's: the server filters). */
const ORDER_READERS: readonly Role[] = ['office', 'engineer', 'foreman', 'shipping', 'admin', 'customer'];
/** Who reads the customer companies. */
const CUSTOMER_READERS: readonly Role[] = ['office', 'engineer', 'foreman', 'shipping', 'admin'];
/** Who reads the engineering queue, order lines' build sheets and the wire stock (engineers and admins also write). */
const SHEET_READERS: readonly Role[] = ['engineer', 'office', 'foreman', 'admin'];
/** Who enters and changes orders and customers. */
const ORDER_WRITERS: readonly Role[] = ['office', 'admin'];
/** Who reads shipments (and their documents). */
const SHIPMENT_READERS: readonly Role[] = ['shipping', 'foreman', 'office', 'admin'];
/** Who records shipments. */
const SHIPPERS: readonly Role[] = ['shipping', 'admin'];
/** Order readers who find orders in the top navigation; the customer's nav shows their own view (/portal) instead. */
const ORDER_NAV: readonly Role[] = ORDER_READERS.filter((r) => r !== 'customer');

/** Where a screen sits when a role's navigation is long enough to gather screens under groups. */
export const NAV_GROUPS = ['sales', 'engineering', 'floor', 'quality', 'shipping', 'admin'] as const;
export type NavGroup = (typeof NAV_GROUPS)[number];
export const NAV_GROUP_LABELS: Record<NavGroup, string> = {
  sales: 'Sales',
  engineering: 'Engineering',
  floor: 'Floor',
  quality: 'Quality',
  shipping: 'Shipping',
  admin: 'Admin',
};

export type Screen = {
  id: ScreenId;
  path: string;
  label: string;
  roles: readonly Role[];
  /** Shown in the top navigation. */
  inNav: boolean;
  /** When only some of its roles find it in the navigation (the others open it by link). */
  navRoles?: readonly Role[];
  /** Its group in a long navigation (screens without one stay top-level links). */
  group?: NavGroup;
};

export const SCREENS: readonly Screen[] = [
  { id: 'home', path: '/', label: 'Home', roles: ROLES, inNav: true },
  { id: 'orders', path: '/orders', label: 'Orders', roles: ORDER_READERS, inNav: true, navRoles: ORDER_NAV, group: 'sales' },
  { id: 'orderNew', path: '/orders/new', label: 'New order', roles: ORDER_WRITERS, inNav: false },
  { id: 'order', path: '/orders/:id', label: 'Order', roles: ORDER_READERS, inNav: false },
  { id: 'orderEdit', path: '/orders/:id/edit', label: 'Edit order', roles: ORDER_WRITERS, inNav: false },
  { id: 'customers', path: '/customers', label: 'Customers', roles: CUSTOMER_READERS, inNav: true, group: 'sales' },
  { id: 'customerNew', path: '/customers/new', label: 'New customer', roles: ORDER_WRITERS, inNav: false },
  { id: 'customer', path: '/customers/:id', label: 'Customer', roles: CUSTOMER_READERS, inNav: false },
  { id: 'customerEdit', path: '/customers/:id/edit', label: 'Edit customer', roles: ORDER_WRITERS, inNav: false },
  { id: 'imports', path: '/imports', label: 'Import', roles: ORDER_WRITERS, inNav: true, group: 'sales' },
  { id: 'engineering', path: '/engineering', label: 'Engineering', roles: SHEET_READERS, inNav: true, group: 'engineering' },
  { id: 'engineeringLine', path: '/engineering/lines/:id', label: 'Order line', roles: SHEET_READERS, inNav: false },
  { id: 'spools', path: '/stock', label: 'Wire stock', roles: SHEET_READERS, inNav: true, group: 'engineering' },
  { id: 'floorBoard', path: '/board', label: 'Board', roles: STAFF_ROLES, inNav: true, group: 'floor' },
  { id: 'floorLoad', path: '/load', label: 'Load', roles: ['foreman', 'admin'], inNav: true, group: 'floor' },
  { id: 'myWork', path: '/my-work', label: 'My work', roles: ['floor', 'foreman'], inNav: true, group: 'floor' },
  { id: 'scan', path: '/scan', label: 'Scan', roles: ['floor', 'foreman'], inNav: true, group: 'floor' },
  { id: 'workOrder', path: '/work-orders/:id', label: 'Work order', roles: STAFF_ROLES, inNav: false },
  { id: 'testBench', path: '/test-bench', label: 'Test bench', roles: ['floor', 'foreman', 'admin'], inNav: true, navRoles: ['floor', 'foreman'], group: 'floor' },
  { id: 'workOrderTests', path: '/work-orders/:id/tests', label: 'Work order tests', roles: STAFF_ROLES, inNav: false },
  { id: 'quality', path: '/quality', label: 'Quality', roles: ['foreman', 'engineer', 'admin', 'office'], inNav: true, group: 'quality' },
  { id: 'designFeedback', path: '/quality/design', label: 'Design feedback', roles: ['engineer', 'admin'], inNav: true, group: 'quality' },
  { id: 'shippingReady', path: '/shipping', label: 'Ready to ship', roles: ['shipping', 'foreman', 'admin'], inNav: true, navRoles: SHIPPERS, group: 'shipping' },
  { id: 'shipmentNew', path: '/shipments/new', label: 'New shipment', roles: SHIPPERS, inNav: false },
  { id: 'shipments', path: '/shipments', label: 'Shipments', roles: SHIPMENT_READERS, inNav: true, group: 'shipping' },
  { id: 'shipment', path: '/shipments/:id', label: 'Shipment', roles: SHIPMENT_READERS, inNav: false },
  { id: 'portalOrders', path: '/portal/orders', label: 'Your orders', roles: ['customer'], inNav: true },
  { id: 'portalOrder', path: '/portal/orders/:id', label: 'Order', roles: ['customer'], inNav: false },
  { id: 'portalShipments', path: '/portal/shipments', label: 'Shipments', roles: ['customer'], inNav: true },
  { id: 'stations', path: '/stations', label: 'Stations', roles: ['admin'], inNav: true, group: 'admin' },
  { id: 'users', path: '/users', label: 'Users', roles: ['admin'], inNav: true, group: 'admin' },
  { id: 'outbox', path: '/outbox', label: 'Outbox', roles: ['admin'], inNav: true, group: 'admin' },
  { id: 'settings', path: '/settings', label: 'Settings', roles: ['admin'], inNav: true, group: 'admin' },
  { id: 'integrations', path: '/integrations', label: 'API and tokens', roles: ['admin'], inNav: true, group: 'admin' },
];

export function screen(id: ScreenId): Screen {
  const s = SCREENS.find((x) => x.id === id);
  if (!s) throw new Error(`No screen ${id}`);
  return s;
}

/** The navigation for one role. */
export const navFor = (role: Role) => SCREENS.filter((s) => s.inNav && s.roles.includes(role) && (s.navRoles ?? s.roles).includes(role));

export const canOpen = (role: Role, id: ScreenId) => screen(id).roles.includes(role);

/** Roles that work standing at a bench or a tablet: bigger targets, larger type. */
export const TOUCH_ROLES: readonly Role[] = ['floor', 'foreman', 'shipping'];
