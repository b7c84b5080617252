/** Route module for /portal/orders (lazy-loaded): the customer's orders. */
export { PortalOrdersPage as Component } from './PortalOrdersPage';
