import { hydrate } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { createRoot, hydrateRoot } from 'react-dom/client';
import { matchRoutes } from 'react-router';
import { App } from './app/app.tsx';
import { createAppRouter, createAppRoutes } from './app/router.tsx';
import { createQueryClient } from './lib/query-client.ts';
import type { ServerState } from './ssr/entry-server.tsx';
import './index.css';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

/** The state of a page the server rendered (src/ssr/entry-server.tsx), if this is one. */
function serverState(): ServerState | null {
  const text = document.getElementById('panform-state')?.textContent;
  if (!text) return null;
  try {
    return JSON.parse(text) as ServerState;
  } catch {
    return null;
  }
}

async function start(el: HTMLElement): Promise<void> {
  const state = serverState();
  if (!state) {
    createRoot(el).render(
      <StrictMode>
        <App />
      </StrictMode>,
    );
    return;
  }
  // Take over the server's page: its query answers, its loader answers, and the code of the pages
  // it showed, in place before hydrating so the first render matches the HTML.
  const queryClient = createQueryClient();
  hydrate(queryClient, state.queries);
  const routes = createAppRoutes(queryClient);
  const lazy = (matchRoutes(routes, window.location) ?? []).filter((m) => m.route.lazy);
  await Promise.all(
    lazy.map(async (m) => {
      const loaded = await (m.route.lazy as () => Promise<object>)();
      Object.assign(m.route, { ...loaded, lazy: undefined });
    }),
  );
  const router = createAppRouter(queryClient, routes, state.router);
  hydrateRoot(
    el,
    <StrictMode>
      <App start={{ queryClient, router }} />
    </StrictMode>,
  );
}

void start(root);
