/** Route module for /test-bench (lazy-loaded): the floor's test bench. */
export { TestBenchPage as Component } from './TestBenchPage';
