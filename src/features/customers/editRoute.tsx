/** Route module for /customers/:id/edit (lazy-loaded; office and admin). */
export { EditCustomerPage as Component } from './CustomerFormPage';
