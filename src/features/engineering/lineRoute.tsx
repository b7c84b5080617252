/** Route module for /engineering/lines/:id (lazy-loaded): one line's build sheet desk. */
export { LinePage as Component } from './LinePage';
