/** The customer view's public face: the orders list the customer's home shows. */
export { PortalOrdersList } from './OrdersList';
