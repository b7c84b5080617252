/** /portal/orders: the customer's orders with each line's progress. */
import { PageHeader } from '../../components/Panel';
import { PortalOrdersList } from './OrdersList';

export function PortalOrdersPage() {
  return (
    <div>
      <PageHeader title="Your orders" lead="Everything your company has ordered from the shop, and how far each line has come." />
      <PortalOrdersList />
    </div>
  );
}
