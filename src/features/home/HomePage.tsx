import type { ComponentType } from 'react';
import type { SessionUser } from '../../contracts/auth';
import type { Role } from '../../contracts/roles';
import { useCurrentUser } from '../../lib/session';
import { AdminHome } from './AdminHome';
import { CustomerHome } from './CustomerHome';
import { EngineerHome } from './EngineerHome';
import { FloorHome, ForemanHome, OfficeHome, ShippingHome } from './StaffHomes';

/** Each role's own home. A feature adds its panel to the homes of the roles it serves. */
export const HOMES: Record<Role, ComponentType<{ user: SessionUser }>> = {
  admin: AdminHome,
  office: OfficeHome,
  engineer: EngineerHome,
  foreman: ForemanHome,
  floor: FloorHome,
  shipping: ShippingHome,
  customer: CustomerHome,
};

export function HomePage() {
  const user = useCurrentUser();
  const Home = HOMES[user.role];
  return <Home user={user} />;
}
