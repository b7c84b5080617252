/** Route module for /work-orders/:id (lazy-loaded): one work order with its history. */
export { WorkOrderPage as Component } from './WorkOrderPage';
