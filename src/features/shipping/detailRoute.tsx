/** Route module for /shipments/:id (lazy-loaded): one shipment with its documents and notice. */
export { ShipmentPage as Component } from './ShipmentPage';
