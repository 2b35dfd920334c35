// The server's first render of a formula page: the page as HTML, so the weights are on screen
// before the viewer's code has arrived and started, and the state the browser's router and query
// cache take over from (src/main.tsx hydrates instead of rendering afresh). Built by Vite as a
// server module (dist/ssr/entry-server.js); server/ssr.ts loads it.
import { dehydrate, type DehydratedState } from '@tanstack/react-query';
import { renderToString } from 'react-dom/server';
import { createStaticHandler, createStaticRouter, StaticRouterProvider, type HydrationState } from 'react-router';
import type { FormulaDetail, Me } from '#shared/api';
import { AppFrame } from '../app/app.tsx';
import { createAppRoutes } from '../app/router.tsx';
import { getMeQueryOptions } from '../features/auth/api/get-me.ts';
import { getFormulaQueryOptions } from '../features/formulas/api/get-formula.ts';
import { createQueryClient } from '../lib/query-client.ts';

/** What the browser reads from the page's `#panform-state` element. */
export interface ServerState {
  queries: DehydratedState;
  router: HydrationState;
}

export interface RenderedPage {
  html: string;
  state: ServerState;
}

/**
 * The formula page at `url` for the signed-in `me`, with the formula's API answer `detail`; null
 * when the router would not show that page (a redirect or an error page: the browser renders
 * those itself).
 */
export async function renderFormulaPage(url: string, me: Me, detail: FormulaDetail): Promise<RenderedPage | null> {
  const queryClient = createQueryClient();
  queryClient.setQueryData(getMeQueryOptions().queryKey, me);
  queryClient.setQueryData(getFormulaQueryOptions(detail.formula.id).queryKey, detail);
  const handler = createStaticHandler(createAppRoutes(queryClient));
  const context = await handler.query(new Request(url));
  if (context instanceof Response || context.errors) return null;
  const router = createStaticRouter(handler.dataRoutes, context);
  const html = renderToString(
    <AppFrame queryClient={queryClient}>
      <StaticRouterProvider router={router} context={context} hydrate={false} />
    </AppFrame>,
  );
  return { html, state: { queries: dehydrate(queryClient), router: { loaderData: context.loaderData, actionData: context.actionData, errors: context.errors } } };
}
