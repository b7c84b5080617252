/** Route module for /imports (lazy-loaded; office and admin). */
export { ImportsPage as Component } from './ImportsPage';
