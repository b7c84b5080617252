/** Route module for /my-work (lazy-loaded): my work. */
export { MyWorkPage as Component } from './MyWorkPage';
