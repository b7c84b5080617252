/** Route module for /customers/new (lazy-loaded; office and admin). */
export { NewCustomerPage as Component } from './CustomerFormPage';
