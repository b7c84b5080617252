/** The travelers feature's public face: other features embed the print control. */
export { PrintTravelers } from './PrintTravelers';
