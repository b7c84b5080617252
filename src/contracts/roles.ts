/** The shop's roles — the one definition both the client and the server use. */
export const ROLES = ['admin', 'office', 'engineer', 'foreman', 'floor', 'shipping', 'customer'] as const;
export type Role = (typeof ROLES)[number];

/** Human labels, for menus and tables. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  office: 'Office',
  engineer: 'Engineer',
  foreman: 'Foreman',
  floor: 'Floor',
  shipping: 'Shipping',
  customer: 'Customer',
};

/** Every internal (non-customer) role. */
export const STAFF_ROLES = ROLES.filter((r) => r !== 'customer') as Exclude<Role, 'customer'>[];
