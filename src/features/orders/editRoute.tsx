/** Route module for /orders/:id/edit (lazy-loaded; office and admin; entered orders only). */
export { EditOrderPage as Component } from './OrderFormPage';
