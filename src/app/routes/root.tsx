import { useLayoutEffect } from 'react';
import { isRouteErrorResponse, Link, Outlet, ScrollRestoration, useRouteError } from 'react-router';
import { Banner } from '@/components/ui/banner.tsx';
import { buttonClass } from '@/components/ui/button.tsx';
import { Mark } from '@/components/ui/mark.tsx';
import { errorMessage } from '@/lib/api.ts';
import { applyTheme } from '@/lib/theme.ts';
import { useScreenTheme } from '../theme-scope.ts';

export function RootLayout() {
  const [theme] = useScreenTheme();
  useLayoutEffect(() => applyTheme(theme), [theme]);
  return (
    <>
      <Outlet />
      <ScrollRestoration />
    </>
  );
}

export function HydrateFallback() {
  return (
    <p role="status" className="flex min-h-dvh items-center justify-center gap-3 text-xl font-bold">
      <Mark size={40} /> Ledgerline is starting…
    </p>
  );
}

/** The last net for an error no screen handled: says what happened and offers a way on. */
export function RouteError() {
  const error = useRouteError();
  let title = 'Something went wrong';
  let text = errorMessage(error);
  if (isRouteErrorResponse(error)) {
    const body = error.data as { error?: string } | string | undefined;
    title = error.status === 403 ? 'Not for your role' : error.status === 404 ? 'Not found' : `Error ${error.status}`;
    text = typeof body === 'string' ? body : body?.error ?? error.statusText;
  }
  return (
    <main className="mx-auto flex max-w-2xl flex-col gap-6 px-4 py-12">
      <Banner tone="danger" title={title}>{text}</Banner>
      <div className="flex flex-wrap gap-3">
        <Link to="/cases" className={buttonClass('primary', 'lg')}>Go to the day list</Link>
        <button type="button" className={buttonClass('secondary', 'lg')} onClick={() => window.location.reload()}>Reload</button>
      </div>
    </main>
  );
}
