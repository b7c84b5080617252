/** Route module for /portal/shipments (lazy-loaded): the customer's shipments. */
export { PortalShipmentsPage as Component } from './PortalShipmentsPage';
