/** The auth feature's public face (the sign-in route is loaded by the router from ./routes). */
export { UserMenu } from './UserMenu';
export { ChangePasswordPage } from './ChangePasswordPage';
