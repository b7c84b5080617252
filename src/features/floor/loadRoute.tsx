/** Route module for /load (lazy-loaded): the load view. */
export { LoadPage as Component } from './LoadPage';
