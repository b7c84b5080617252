/** The users feature's public face: other features may read the user list through this query. */
export { usersQuery } from './api';
