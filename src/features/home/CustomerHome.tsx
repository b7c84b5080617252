import type { SessionUser } from '../../contracts/auth';
import { Panel } from '../../components/Panel';
import { PortalOrdersList } from '../portal';
import { AccountPanel, DutiesPanel, HomeFrame } from './parts';

export function CustomerHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <PortalOrdersList />
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} title="What this account is for" />
        <Panel title="Questions about an order">
          <p className="text-graphite-700">
            To change an order — quantities, dates, a revised drawing — contact the shop’s office the way you placed the order. Your account here only
            reads; it never changes what was agreed.
          </p>
        </Panel>
      </div>
      <AccountPanel user={user} />
    </HomeFrame>
  );
}
