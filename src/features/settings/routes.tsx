/** Route module for /settings (lazy-loaded; admins only). */
export { SettingsPage as Component } from './SettingsPage';
