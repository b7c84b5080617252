/** Route module for /board (lazy-loaded): the board. */
export { BoardPage as Component } from './BoardPage';
