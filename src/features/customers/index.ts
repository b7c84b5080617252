/** The customers feature's public face: other features read the company list and one company through these queries. */
export { customerQuery, customersQuery } from './api';
/** A postal address as lines (the shipping and customer screens show ship-to addresses with it). */
export { AddressBlock } from './CustomerPage';
