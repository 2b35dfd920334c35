// The first render of a formula page on the server: the viewer's own page, rendered by the
// viewer's server build (dist/ssr/entry-server.js, from src/ssr/entry-server.tsx) with the same
// answers the API gives, put into index.html. The browser shows the weights as soon as the HTML
// and the stylesheet are in, and takes the page over when its code has started (hydration).
// Any other page, a visitor who is not signed in, or any failure here: the plain index.html,
// and the viewer renders in the browser as before.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { FormulaDetail, Me } from '#shared/api';
import { roleHasPermission } from '#shared/permissions';
import type { ServerContext } from './context.ts';
import { formulaDetailAnswer } from './routes/formulas.ts';
import { me as meAnswer } from './routes/session.ts';

interface RenderedPage {
  html: string;
  state: unknown;
}
interface SsrEntry {
  renderFormulaPage(url: string, me: Me, detail: FormulaDetail): Promise<RenderedPage | null>;
}

const FORMULA_PAGE = /^\/formulas\/([^/]+)\/?$/;

/** `<`, `>`, `&` and the line separators escaped: the JSON cannot end its script element. */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value).replace(/[<>&\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

export interface PageRenderer {
  /** index.html for `path`, with the page rendered in when it can be. */
  page(path: string, search: string, user: Me['user'] | null): Promise<string>;
}

export function createPageRenderer(webDir: string, ctx: ServerContext, log: (m: string) => void): PageRenderer {
  // Read for each page, as a file server would: a rebuilt viewer is served at once.
  const template = () => readFileSync(join(webDir, 'index.html'), 'utf8');
  const entryFile = join(dirname(webDir), 'ssr', 'entry-server.js');
  let entry: Promise<SsrEntry | null> | null = null;
  let warned = false;
  const load = () =>
    (entry ??= existsSync(entryFile)
      ? (import(pathToFileURL(entryFile).href) as Promise<SsrEntry>).catch((e: unknown) => {
          log(`panform serve: the viewer's server build cannot be loaded (${(e as Error).message}); pages render in the browser`);
          return null;
        })
      : Promise.resolve(null));

  async function render(path: string, search: string, user: Me['user']): Promise<RenderedPage | null> {
    const id = FORMULA_PAGE.exec(path)?.[1];
    if (!id || !roleHasPermission(user.role, 'read:formula:active')) return null;
    const ssr = await load();
    if (!ssr) return null;
    let detail: FormulaDetail;
    try {
      detail = JSON.parse((await formulaDetailAnswer(ctx, user.role, decodeURIComponent(id))).body.toString('utf8')) as FormulaDetail;
    } catch {
      // Not found, not visible to this role, not readable: the viewer shows that page itself.
      return null;
    }
    return ssr.renderFormulaPage(`http://panform.local${path}${search}`, meAnswer(user), detail);
  }

  return {
    async page(path, search, user) {
      if (!user) return template();
      let rendered: RenderedPage | null = null;
      try {
        rendered = await render(path, search, user);
      } catch (e) {
        if (!warned) log(`panform serve: a page could not be rendered on the server (${(e as Error).message}); it renders in the browser`);
        warned = true;
      }
      if (!rendered) return template();
      return template()
        .replace('</title>', `</title>\n    <script type="application/json" id="panform-state">${jsonForScript(rendered.state)}</script>`)
        .replace('<div id="root"></div>', `<div id="root">${rendered.html}</div>`);
    },
  };
}
