/** Route module for /users (lazy-loaded; the router's guard admits admins only). */
export { UsersPage as Component } from './UsersPage';
