/** Route module for /customers (lazy-loaded): the company list. */
export { CustomersPage as Component } from './CustomersPage';
