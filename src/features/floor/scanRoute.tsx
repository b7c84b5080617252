/** Route module for /scan (lazy-loaded): the scan station. */
export { ScanPage as Component } from './ScanPage';
