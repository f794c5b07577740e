import { createBrowserRouter, redirect } from 'react-router';
import { ApiError } from '@/lib/api.ts';
import { queryClient } from '@/lib/query-client.ts';
import { signInAgain } from '@/lib/session.ts';
import { HydrateFallback, RootLayout, RouteError } from './routes/root.tsx';

/**
 * Every screen, one lazy module each under ./routes (thin: a guard or a prefetch, and the feature's
 * component). The recorder (`cases/:id/capture`) sits outside the app's header, full screen, with
 * its own guard and `handle: { themeScope: 'capture' }` so it opens in the dim-room theme.
 */
const publicPaths = ['/sign-in', '/forgot-password', '/reset-password', '/invite/'];

export const router = createBrowserRouter([
  {
    id: 'root',
    Component: RootLayout,
    HydrateFallback,
    ErrorBoundary: RouteError,
    children: [
      { path: 'sign-in', lazy: () => import('./routes/sign-in.tsx') },
      { path: 'forgot-password', lazy: () => import('./routes/forgot-password.tsx') },
      { path: 'reset-password', lazy: () => import('./routes/reset-password.tsx') },
      { path: 'invite/:invitationId', lazy: () => import('./routes/invite-accept.tsx') },
      {
        id: 'app',
        lazy: () => import('./routes/app-layout.tsx'),
        children: [
          { index: true, loader: () => redirect('/cases') },
          { path: 'cases', lazy: () => import('./routes/cases-day.tsx') },
          { path: 'cases/new', lazy: () => import('./routes/case-new.tsx') },
          { path: 'cases/:id', lazy: () => import('./routes/case-page.tsx') },
          { path: 'cases/:id/record', lazy: () => import('./routes/case-record.tsx') },
          { path: 'cases/:id/specimens', lazy: () => import('./routes/case-specimens.tsx') },
          { path: 'catalogue', lazy: () => import('./routes/admin-catalogue.tsx') },
          { path: 'admin/invite', lazy: () => import('./routes/admin-invite.tsx') },
        ],
      },
      { path: 'cases/:id/capture', lazy: () => import('./routes/case-capture.tsx') },
      { path: '*', lazy: () => import('./routes/not-found.tsx') },
    ],
  },
]);

// A 401 from any query on a signed-in screen means the session ended elsewhere (expired, revoked):
// forget the saved user and go to sign-in, coming back here afterwards. During a navigation the
// guard (requireMe) answers instead.
queryClient.getQueryCache().subscribe((event) => {
  if (event.type !== 'updated' || event.action.type !== 'error') return;
  const err = event.action.error;
  if (!(err instanceof ApiError) || !err.isUnauthorised || router.state.navigation.state !== 'idle') return;
  const { pathname } = router.state.location;
  if (publicPaths.some((p) => pathname.startsWith(p))) return;
  void signInAgain((to, options) => router.navigate(to, options));
});
