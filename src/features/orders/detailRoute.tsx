/** Route module for /orders/:id (lazy-loaded): one order with its lines, drawings and history. */
export { OrderPage as Component } from './OrderPage';
