/** The homes of office, foreman, floor and shipping: their work, their safety notes, their units. */
import type { SessionUser } from '../../contracts/auth';
import { FloorHomePanel } from '../floor';
import { OrdersHomePanel } from '../orders';
import { ShippingHomePanel } from '../shipping';
import { AccountPanel, DutiesPanel, HomeFrame, SAFETY, SafetyPanel } from './parts';

export function OfficeHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <div className="grid gap-5 lg:grid-cols-2">
        <OrdersHomePanel />
        <DutiesPanel user={user} />
      </div>
      <AccountPanel user={user} />
    </HomeFrame>
  );
}

export function ForemanHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <FloorHomePanel />
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} />
        <SafetyPanel items={[SAFETY.hipot, SAFETY.hot, SAFETY.lifting]} />
      </div>
      <AccountPanel user={user} large />
    </HomeFrame>
  );
}

export function FloorHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <FloorHomePanel />
      <SafetyPanel items={[SAFETY.hipot, SAFETY.hot]} />
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} title="Your work at the bench" />
        <AccountPanel user={user} large />
      </div>
    </HomeFrame>
  );
}

export function ShippingHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <ShippingHomePanel />
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} />
        <AccountPanel user={user} large />
      </div>
    </HomeFrame>
  );
}
