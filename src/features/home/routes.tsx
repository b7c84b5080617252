/** Route module for / (lazy-loaded): the signed-in role's own home. */
export { HomePage as Component } from './HomePage';
