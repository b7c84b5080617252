import { Outlet, useLocation, useNavigation } from 'react-router';
import { Brand } from '../components/Brand';
import { ChangePasswordPage, UserMenu } from '../features/auth';
import { useCurrentUser } from '../lib/session';
import { MainNav } from './Nav';
import { TOUCH_ROLES } from './screens';

/** The signed-in frame: top bar with the role's navigation and the user menu, then the screen. */
export function Layout() {
  const user = useCurrentUser();
  const navigation = useNavigation();
  const touch = TOUCH_ROLES.includes(user.role);
  // The board uses the whole width of the window: every stage side by side.
  const wide = useLocation().pathname === '/board';
  return (
    <div className="flex min-h-screen flex-col" data-density={touch ? 'touch' : 'dense'} data-role={user.role}>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b-[3px] border-copper-500 bg-graphite-900 text-graphite-100">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Brand />
          {!user.mustChangePassword && <MainNav role={user.role} touch={touch} />}
          <UserMenu touch={touch} />
        </div>
        <div aria-hidden className={`h-0.5 bg-copper-400 transition-opacity ${navigation.state === 'loading' ? 'animate-pulse opacity-100' : 'opacity-0'}`} />
      </header>
      <main id="main" className={`mx-auto w-full flex-1 px-4 py-6 ${wide ? 'max-w-none' : 'max-w-7xl'}`}>
        {user.mustChangePassword ? <ChangePasswordPage /> : <Outlet />}
      </main>
      <footer className="border-t border-graphite-200 py-3 text-center text-xs text-graphite-500">
        Spoolwright — job tracking for coil winding
      </footer>
    </div>
  );
}

/** Shown while the first screen's data loads. */
export function StartupFallback() {
  return (
    <div className="flex min-h-screen items-center justify-center bg-graphite-50" role="status">
      <span className="flex items-center gap-3 text-graphite-600">
        <span aria-hidden className="size-5 animate-spin rounded-full border-2 border-copper-500 border-r-transparent" />
        Opening Spoolwright…
      </span>
    </div>
  );
}
