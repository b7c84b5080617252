/** Route module for /orders/new (lazy-loaded; office and admin). */
export { NewOrderPage as Component } from './OrderFormPage';
