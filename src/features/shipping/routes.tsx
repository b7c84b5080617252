/** Route module for /shipments (lazy-loaded): every shipment, sortable, filterable, exportable. */
export { ShipmentsPage as Component } from './ShipmentsPage';
