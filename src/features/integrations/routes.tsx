/** Route module for /integrations (lazy-loaded; admins only). */
export { IntegrationsPage as Component } from './IntegrationsPage';
