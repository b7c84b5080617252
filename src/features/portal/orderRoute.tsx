/** Route module for /portal/orders/:id (lazy-loaded): one of the customer's orders with its shipments. */
export { PortalOrderPage as Component } from './PortalOrderPage';
