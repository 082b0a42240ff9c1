import { useEffect, useRef } from 'react';
import { Outlet, ScrollRestoration, useLocation, useNavigation } from 'react-router';

/**
 * Around every page: the skip link, the navigation progress bar, and focus management. After
 * a client-side navigation, focus moves to the main region so keyboard and screen-reader
 * users start at the new page's content instead of a stale link.
 */
export function RootLayout() {
  const location = useLocation();
  const navigation = useNavigation();
  const firstRender = useRef(true);

  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    const main = document.getElementById('main');
    // A page that focused its own first field (autoFocus) keeps that focus.
    if (main && !main.contains(document.activeElement)) main.focus({ preventScroll: true });
  }, [location.pathname]);

  return (
    <>
      <a
        href="#main"
        className="sr-only z-50 rounded bg-white text-sm font-medium shadow focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:px-3 focus:py-2"
      >
        Skip to main content
      </a>
      {navigation.state !== 'idle' && (
        <div role="progressbar" aria-label="Loading page" className="fixed inset-x-0 top-0 z-50 h-0.5 overflow-hidden bg-primary-100">
          <div className="h-full w-1/3 animate-pulse bg-primary-600" />
        </div>
      )}
      <Outlet />
      <ScrollRestoration />
    </>
  );
}

/** Shown while the first loader (who is signed in?) runs. */
export function AppLoading() {
  return (
    <div role="status" className="grid min-h-screen place-items-center text-sm text-slate-600">
      Loading Bellwether…
    </div>
  );
}
