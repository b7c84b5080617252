/** Route module for /stock (lazy-loaded): the spools of magnet wire. */
export { SpoolsPage as Component } from './SpoolsPage';
