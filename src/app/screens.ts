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
  | 'stations';

/** Who reads orders (a customer only its own company's: the server filters). */
const ORDER_READERS: readonly Role[] = ['office', 'engineer', 'foreman', 'shipping', 'admin', 'customer'];
/** Who reads the customer companies. */
const CUSTOMER_READERS: readonly Role[] = ['office', 'engineer', 'foreman', 'shipping', 'admin'];
/** Who reads the engineering queue, order lines' build sheets and the wire stock (engineers and admins also write). */
const SHEET_READERS: readonly Role[] = ['engineer', 'office', 'foreman', 'admin'];
/** Who enters and changes orders and customers. */
const ORDER_WRITERS: readonly Role[] = ['office', 'admin'];

export type Screen = {
  id: ScreenId;
  path: string;
  label: string;
  roles: readonly Role[];
  /** Shown in the top navigation. */
  inNav: boolean;
};

export const SCREENS: readonly Screen[] = [
  { id: 'home', path: '/', label: 'Home', roles: ROLES, inNav: true },
  { id: 'orders', path: '/orders', label: 'Orders', roles: ORDER_READERS, inNav: true },
  { id: 'orderNew', path: '/orders/new', label: 'New order', roles: ORDER_WRITERS, inNav: false },
  { id: 'order', path: '/orders/:id', label: 'Order', roles: ORDER_READERS, inNav: false },
  { id: 'orderEdit', path: '/orders/:id/edit', label: 'Edit order', roles: ORDER_WRITERS, inNav: false },
  { id: 'customers', path: '/customers', label: 'Customers', roles: CUSTOMER_READERS, inNav: true },
  { id: 'customerNew', path: '/customers/new', label: 'New customer', roles: ORDER_WRITERS, inNav: false },
  { id: 'customer', path: '/customers/:id', label: 'Customer', roles: CUSTOMER_READERS, inNav: false },
  { id: 'customerEdit', path: '/customers/:id/edit', label: 'Edit customer', roles: ORDER_WRITERS, inNav: false },
  { id: 'engineering', path: '/engineering', label: 'Engineering', roles: SHEET_READERS, inNav: true },
  { id: 'engineeringLine', path: '/engineering/lines/:id', label: 'Order line', roles: SHEET_READERS, inNav: false },
  { id: 'spools', path: '/stock', label: 'Wire stock', roles: SHEET_READERS, inNav: true },
  { id: 'floorBoard', path: '/board', label: 'Board', roles: STAFF_ROLES, inNav: true },
  { id: 'floorLoad', path: '/load', label: 'Load', roles: ['foreman', 'admin'], inNav: true },
  { id: 'myWork', path: '/my-work', label: 'My work', roles: ['floor', 'foreman'], inNav: true },
  { id: 'scan', path: '/scan', label: 'Scan', roles: ['floor', 'foreman'], inNav: true },
  { id: 'workOrder', path: '/work-orders/:id', label: 'Work order', roles: STAFF_ROLES, inNav: false },
  { id: 'stations', path: '/stations', label: 'Stations', roles: ['admin'], inNav: true },
  { id: 'users', path: '/users', label: 'Users', roles: ['admin'], inNav: true },
  { id: 'outbox', path: '/outbox', label: 'Outbox', roles: ['admin'], inNav: true },
  { id: 'settings', path: '/settings', label: 'Settings', roles: ['admin'], inNav: true },
];

export function screen(id: ScreenId): Screen {
  const s = SCREENS.find((x) => x.id === id);
  if (!s) throw new Error(`No screen ${id}`);
  return s;
}

/** The navigation for one role. */
export const navFor = (role: Role) => SCREENS.filter((s) => s.inNav && s.roles.includes(role));

export const canOpen = (role: Role, id: ScreenId) => screen(id).roles.includes(role);

/** Roles that work standing at a bench or a tablet: bigger targets, larger type. */
export const TOUCH_ROLES: readonly Role[] = ['floor', 'foreman', 'shipping'];
