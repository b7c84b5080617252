/** Route module for /customers/:id (lazy-loaded): one company with its contacts and orders. */
export { CustomerPage as Component } from './CustomerPage';
