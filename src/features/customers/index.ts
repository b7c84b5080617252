/** The customers feature's public face: other features read the company list and one company through these queries. */
export { customerQuery, customersQuery } from './api';
