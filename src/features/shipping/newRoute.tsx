/** Route module for /shipments/new (lazy-loaded): a shipment for the work orders chosen (`?wo=`). */
export { ShipmentFormPage as Component } from './ShipmentFormPage';
