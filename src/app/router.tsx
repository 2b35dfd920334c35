// The router: one table, pages loaded lazily (each its own chunk), loaders prefetching with the
// same query options the pages read.
import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type LoaderFunctionArgs, type RouteObject } from 'react-router';
import { NotFoundView } from '../components/error-view.tsx';
import { Loading } from '../components/spinner.tsx';
import { requireMe } from './guards.ts';
import { AppShell } from './shell.tsx';
import { paths } from './paths.ts';
import { RootErrorBoundary, RouteErrorBoundary } from './route-error.tsx';

/** What a lazy route module exports. */
export interface RouteModule {
  default: React.ComponentType;
  clientLoader?: (queryClient: QueryClient) => (args: LoaderFunctionArgs) => unknown;
}

const convert = (queryClient: QueryClient) => (m: RouteModule) => ({
  Component: m.default,
  loader: m.clientLoader?.(queryClient),
  ErrorBoundary: RouteErrorBoundary,
});

export function createAppRouter(queryClient: QueryClient) {
  const routes: RouteObject[] = [
    {
      path: '/',
      ErrorBoundary: RootErrorBoundary,
      HydrateFallback: () => (
        <main className="mx-auto max-w-5xl px-4 py-10">
          <Loading label="Opening Panform…" />
        </main>
      ),
      children: [
        { path: paths.signIn.path, lazy: () => import('./routes/sign-in.tsx').then(convert(queryClient)) },
        { path: paths.forgotPassword.path, lazy: () => import('./routes/forgot-password.tsx').then(convert(queryClient)) },
        { path: paths.resetPassword.path, lazy: () => import('./routes/reset-password.tsx').then(convert(queryClient)) },
        { path: paths.resetPasswordShort.path, lazy: () => import('./routes/reset-password.tsx').then(convert(queryClient)) },
        {
          id: 'app',
          Component: AppShell,
          ErrorBoundary: RouteErrorBoundary,
          loader: ({ request }) => requireMe(queryClient, request),
          children: [
            { index: true, loader: () => redirect(paths.formulas.getHref()) },
            { path: paths.formulas.path, lazy: () => import('./routes/formulas.tsx').then(convert(queryClient)) },
            { path: paths.formula.path, lazy: () => import('./routes/formula.tsx').then(convert(queryClient)) },
            { path: paths.plans.path, lazy: () => import('./routes/plans.tsx').then(convert(queryClient)) },
            { path: paths.plan.path, lazy: () => import('./routes/plan.tsx').then(convert(queryClient)) },
            { path: paths.changes.path, lazy: () => import('./routes/changes.tsx').then(convert(queryClient)) },
            { path: paths.formulaChanges.path, lazy: () => import('./routes/formula-changes.tsx').then(convert(queryClient)) },
            { path: paths.account.path, lazy: () => import('./routes/account.tsx').then(convert(queryClient)) },
            { path: '*', Component: NotFoundView },
          ],
        },
      ],
    },
  ];
  return createBrowserRouter(routes);
}
