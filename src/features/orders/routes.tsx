/** Route module for /orders (lazy-loaded): the order list. */
export { OrdersPage as Component } from './OrdersPage';
