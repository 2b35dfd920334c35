// GET /schemas/<kind>.schema.json: Panform's JSON Schemas at a stable address, for editors
// (yaml-language-server's `$schema=` line, an editor's schema settings) and CI in a bakery's own
// repository. Public like the viewer's own scripts: the file formats are no secret, and an editor
// cannot sign in. Read once from the installation (shared/schema/, shipped in the package).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { Router, type Request, type Response } from 'express';
import { schemaFolder } from '../install-paths.ts';

/** The schemas served, by file name. */
export const SCHEMA_NAMES = ['formula.schema.json', 'catalog.schema.json', 'plan.schema.json'] as const;

/** An hour: a new Panform version's schema reaches editors within it. */
export const SCHEMA_MAX_AGE = 3600;

export function schemasRouter(dir: string | null = schemaFolder()): Router {
  const router = Router();
  const files = new Map<string, { body: Buffer; etag: string }>();
  if (dir) {
    for (const name of SCHEMA_NAMES) {
      const body = readFileSync(join(dir, name));
      files.set(name, { body, etag: `"${createHash('sha256').update(body).digest('base64url').slice(0, 27)}"` });
    }
  }
  router.get('/schemas/:name', (req: Request, res: Response) => {
    const file = files.get(String(req.params.name));
    if (!file) {
      res.status(404).type('text/plain').send(`No such schema. Panform serves ${SCHEMA_NAMES.map((n) => `/schemas/${n}`).join(', ')}.\n`);
      return;
    }
    res.set('Cache-Control', `public, max-age=${SCHEMA_MAX_AGE}`);
    res.set('ETag', file.etag);
    // Editors fetch from their own origin (or none): the schema may be read cross-origin.
    res.set('Access-Control-Allow-Origin', '*');
    res.set('Cross-Origin-Resource-Policy', 'cross-origin');
    // res.send answers 304 when the editor's copy is still fresh (If-None-Match).
    res.type('application/schema+json').send(file.body);
  });
  return router;
}
