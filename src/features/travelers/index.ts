/** The travelers feature's public face: other features embed the print controls. */
export { PrintTravelers } from './PrintTravelers';
export { OrderWorkOrders } from './OrderWorkOrders';
