/** The shipping feature's public face: the shipping bench panel for the shipping role's home. */
export { ShippingHomePanel } from './HomePanel';
