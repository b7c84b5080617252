/** Route module for /quality (lazy-loaded): the shop's first-pass yield and failure reasons. */
export { QualityPage as Component } from './QualityPage';
