/** Route module for /work-orders/:id/tests (lazy-loaded): one work order's test records. */
export { WorkOrderTestsPage as Component } from './WorkOrderTestsPage';
