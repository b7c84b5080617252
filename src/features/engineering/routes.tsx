/** Route module for /engineering (lazy-loaded): the queue of lines awaiting engineering. */
export { QueuePage as Component } from './QueuePage';
