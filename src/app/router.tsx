// The router: one table, pages loaded lazily (each its own chunk), loaders prefetching with the
// same query options the pages read.
import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type RouteObject } from 'react-router';
import { NotFoundView } from '../components/error-view.tsx';
import { Loading } from '../components/spinner.tsx';
import { requireMe } from './guards.ts';
import { createLoaders } from './loaders.ts';
import { AppShell } from './shell.tsx';
import { paths } from './paths.ts';
import { RootErrorBoundary, RouteErrorBoundary } from './route-error.tsx';

/** A lazily loaded page: its component, with the route's error boundary. */
const page = (load: () => Promise<{ default: React.ComponentType }>) => () =>
  load().then((m) => ({ Component: m.default, ErrorBoundary: RouteErrorBoundary }));

export function createAppRoutes(queryClient: QueryClient): RouteObject[] {
  const loaders = createLoaders(queryClient);
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
        { path: paths.signIn.path, loader: loaders.signIn, lazy: page(() => import('./routes/sign-in.tsx')) },
        { path: paths.forgotPassword.path, lazy: page(() => import('./routes/forgot-password.tsx')) },
        { path: paths.resetPassword.path, lazy: page(() => import('./routes/reset-password.tsx')) },
        { path: paths.resetPasswordShort.path, lazy: page(() => import('./routes/reset-password.tsx')) },
        {
          id: 'app',
          Component: AppShell,
          ErrorBoundary: RouteErrorBoundary,
          loader: ({ request }) => requireMe(queryClient, request),
          children: [
            { index: true, loader: () => redirect(paths.formulas.getHref()) },
            { path: paths.formulas.path, loader: loaders.formulas, lazy: page(() => import('./routes/formulas.tsx')) },
            { path: paths.formula.path, loader: loaders.formula, lazy: page(() => import('./routes/formula.tsx')) },
            { path: paths.plans.path, loader: loaders.plans, lazy: page(() => import('./routes/plans.tsx')) },
            { path: paths.plan.path, loader: loaders.plan, lazy: page(() => import('./routes/plan.tsx')) },
            { path: paths.changes.path, loader: loaders.changes, lazy: page(() => import('./routes/changes.tsx')) },
            { path: paths.formulaChanges.path, loader: loaders.formulaChanges, lazy: page(() => import('./routes/formula-changes.tsx')) },
            { path: paths.ingredients.path, loader: loaders.ingredients, lazy: page(() => import('./routes/ingredients.tsx')) },
            { path: paths.account.path, lazy: page(() => import('./routes/account.tsx')) },
            { path: paths.accounts.path, loader: loaders.accounts, lazy: page(() => import('./routes/accounts.tsx')) },
            { path: '*', Component: NotFoundView },
          ],
        },
      ],
    },
  ];
  return routes;
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(createAppRoutes(queryClient));
}
