// Route loaders, kept out of the lazily loaded page modules on purpose: the router runs them at
// once, so a page's data is already on its way while its code downloads. Each checks the role
// with the server's rule and starts the page's queries (without waiting for them: the page shows
// its own loading state).
import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router';
import { getAccountsQueryOptions } from '../features/accounts/api/accounts.ts';
import { getChangesQueryOptions } from '../features/changes/api/get-changes.ts';
import { getRevisionsQueryOptions } from '../features/changes/api/get-revisions.ts';
import { getMeQueryOptions } from '../features/auth/api/get-me.ts';
import { getFormulaQueryOptions } from '../features/formulas/api/get-formula.ts';
import { filtersFromSearch, getFormulasQueryOptions } from '../features/formulas/api/get-formulas.ts';
import { getPlanQueryOptions } from '../features/plans/api/get-plan.ts';
import { getPlansQueryOptions } from '../features/plans/api/get-plans.ts';
import { requirePermission } from './guards.ts';
import { getCatalogQueryOptions } from '../features/ingredients/api/get-catalog.ts';
import { paths } from './paths.ts';

type Loader = (args: LoaderFunctionArgs) => unknown;

/** Only a path inside the viewer may be a place to come back to after signing in. */
export function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : paths.formulas.getHref();
}

export function createLoaders(queryClient: QueryClient) {
  return {
    signIn: (async ({ request }) => {
      // Already signed in: go on to where the person was heading. Always asked afresh: a cached
      // answer may be from a session that has since ended.
      const me = await queryClient.fetchQuery({ ...getMeQueryOptions(), staleTime: 0 }).catch(() => null);
      if (me) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
      return null;
    }) satisfies Loader,
    formulas: (({ request }) => {
      void queryClient.prefetchQuery(getFormulasQueryOptions(filtersFromSearch(new URL(request.url).searchParams)));
      return null;
    }) satisfies Loader,
    formula: (({ params }) => {
      if (params.id) void queryClient.prefetchQuery(getFormulaQueryOptions(params.id));
      return null;
    }) satisfies Loader,
    plans: (async ({ request }) => {
      void queryClient.prefetchQuery(getPlansQueryOptions());
      await requirePermission(queryClient, request, 'read:plan');
      return null;
    }) satisfies Loader,
    plan: (async ({ request, params }) => {
      if (params.date) void queryClient.prefetchQuery(getPlanQueryOptions(params.date));
      await requirePermission(queryClient, request, 'read:plan');
      return null;
    }) satisfies Loader,
    accounts: (async ({ request }) => {
      await requirePermission(queryClient, request, 'manage:users');
      void queryClient.prefetchQuery(getAccountsQueryOptions());
      return null;
    }) satisfies Loader,
    ingredients: (async ({ request }) => {
      void queryClient.prefetchQuery(getCatalogQueryOptions());
      await requirePermission(queryClient, request, 'read:catalog');
      return null;
    }) satisfies Loader,
    changes: (async ({ request }) => {
      await requirePermission(queryClient, request, 'read:history');
      void queryClient.prefetchQuery(getChangesQueryOptions());
      return null;
    }) satisfies Loader,
    formulaChanges: (async ({ request, params }) => {
      await requirePermission(queryClient, request, 'read:history');
      if (params.id) void queryClient.prefetchQuery(getRevisionsQueryOptions(params.id));
      return null;
    }) satisfies Loader,
  };
}
