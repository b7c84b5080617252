/** The orders feature's public face: status badges for other screens, and the office home's panel. */
export { LateBadge, OrderStatusBadge, OrderStatusText } from './status';
export { OrdersHomePanel } from './OrdersHomePanel';
