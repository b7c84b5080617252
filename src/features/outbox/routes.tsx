/** Route module for /outbox (lazy-loaded; admins only). */
export { OutboxPage as Component } from './OutboxPage';
