/**
 * The data router. The shell (layout, guards, error pages) loads with the app; every screen is a
 * lazy route module exporting `Component`, fetched when first opened. Guards run as loaders, so a
 * deep link checks the session (and the role) before the screen draws.
 */
import { createBrowserRouter } from 'react-router';
import { setUnauthorizedHandler, signInHref } from '../lib/api';
import { queryClient } from '../lib/queryClient';
import { SESSION_KEY, SIGNED_IN_ROUTE_ID, setSessionUser } from '../lib/session';
import { requireScreen, requireSignedIn } from './guards';
import { Layout, StartupFallback } from './Layout';
import { NotFound } from './NotFound';
import { RouteError } from './RouteError';

export const router = createBrowserRouter([
  {
    path: '/sign-in',
    lazy: () => import('../features/auth/routes'),
    ErrorBoundary: RouteError,
    HydrateFallback: StartupFallback,
  },
  {
    id: SIGNED_IN_ROUTE_ID,
    path: '/',
    loader: requireSignedIn,
    Component: Layout,
    ErrorBoundary: RouteError,
    HydrateFallback: StartupFallback,
    children: [
      {
        // Errors below show inside the layout, with the navigation still there.
        ErrorBoundary: RouteError,
        children: [
          { index: true, loader: requireScreen('home'), lazy: () => import('../features/home/routes') },
          { path: 'orders', loader: requireScreen('orders'), lazy: () => import('../features/orders/routes') },
          { path: 'orders/new', loader: requireScreen('orderNew'), lazy: () => import('../features/orders/newRoute') },
          { path: 'orders/:id', loader: requireScreen('order'), lazy: () => import('../features/orders/detailRoute') },
          { path: 'orders/:id/edit', loader: requireScreen('orderEdit'), lazy: () => import('../features/orders/editRoute') },
          { path: 'customers', loader: requireScreen('customers'), lazy: () => import('../features/customers/routes') },
          { path: 'customers/new', loader: requireScreen('customerNew'), lazy: () => import('../features/customers/newRoute') },
          { path: 'customers/:id', loader: requireScreen('customer'), lazy: () => import('../features/customers/detailRoute') },
          { path: 'customers/:id/edit', loader: requireScreen('customerEdit'), lazy: () => import('../features/customers/editRoute') },
          { path: 'engineering', loader: requireScreen('engineering'), lazy: () => import('../features/engineering/routes') },
          { path: 'engineering/lines/:id', loader: requireScreen('engineeringLine'), lazy: () => import('../features/engineering/lineRoute') },
          { path: 'stock', loader: requireScreen('spools'), lazy: () => import('../features/stock/routes') },
          { path: 'board', loader: requireScreen('floorBoard'), lazy: () => import('../features/floor/routes') },
          { path: 'load', loader: requireScreen('floorLoad'), lazy: () => import('../features/floor/loadRoute') },
          { path: 'my-work', loader: requireScreen('myWork'), lazy: () => import('../features/floor/myWorkRoute') },
          { path: 'scan', loader: requireScreen('scan'), lazy: () => import('../features/floor/scanRoute') },
          { path: 'work-orders/:id', loader: requireScreen('workOrder'), lazy: () => import('../features/floor/workOrderRoute') },
          { path: 'stations', loader: requireScreen('stations'), lazy: () => import('../features/floor/stationsRoute') },
          { path: 'users', loader: requireScreen('users'), lazy: () => import('../features/users/routes') },
          { path: 'outbox', loader: requireScreen('outbox'), lazy: () => import('../features/outbox/routes') },
          { path: 'settings', loader: requireScreen('settings'), lazy: () => import('../features/settings/routes') },
          { path: 'shipping', loader: requireScreen('shippingReady'), lazy: () => import('../features/shipping/readyRoute') },
          { path: 'shipments', loader: requireScreen('shipments'), lazy: () => import('../features/shipping/routes') },
          { path: 'shipments/new', loader: requireScreen('shipmentNew'), lazy: () => import('../features/shipping/newRoute') },
          { path: 'shipments/:id', loader: requireScreen('shipment'), lazy: () => import('../features/shipping/detailRoute') },
          { path: 'portal/orders', loader: requireScreen('portalOrders'), lazy: () => import('../features/portal/routes') },
          { path: 'portal/orders/:id', loader: requireScreen('portalOrder'), lazy: () => import('../features/portal/orderRoute') },
          { path: 'portal/shipments', loader: requireScreen('portalShipments'), lazy: () => import('../features/portal/shipmentsRoute') },
          { path: 'test-bench', loader: requireScreen('testBench'), lazy: () => import('../features/quality/benchRoute') },
          { path: 'work-orders/:id/tests', loader: requireScreen('workOrderTests'), lazy: () => import('../features/quality/workOrderTestsRoute') },
          { path: 'quality', loader: requireScreen('quality'), lazy: () => import('../features/quality/qualityRoute') },
          { path: 'quality/design', loader: requireScreen('designFeedback'), lazy: () => import('../features/quality/designRoute') },
          { path: 'imports', loader: requireScreen('imports'), lazy: () => import('../features/imports/routes') },
          { path: 'integrations', loader: requireScreen('integrations'), lazy: () => import('../features/integrations/routes') },
          { path: '*', Component: NotFound },
        ],
      },
    ],
  },
]);

// A 401 from any API call: the session is gone. Forget it and go to sign-in, coming back after.
setUnauthorizedHandler((next) => {
  if (window.location.pathname === '/sign-in') return;
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== SESSION_KEY[0] });
  setSessionUser(null);
  void router.navigate(signInHref(next), { replace: true });
});
