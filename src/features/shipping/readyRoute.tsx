/** Route module for /shipping (lazy-loaded): work orders ready to ship, by customer and order. */
export { ReadyPage as Component } from './ReadyPage';
