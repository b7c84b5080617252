/** Route module for /stations (lazy-loaded): the stations admin page. */
export { StationsPage as Component } from './StationsPage';
