// `panform friction` while a server holds the PGlite folder: the command cannot open the
// database, so it asks the server over the local channel (loopback and the lock file's token, as
// for loads and accounts). The answer is GET /api/friction's, as an admin sees it.
import { Router, type Request, type Response } from 'express';
import type { ServerContext } from '../context.ts';
import { frictionResponse } from '../records/friction.ts';
import { localChannelGuard } from './internal-load.ts';

export function createInternalFrictionRouter(ctx: ServerContext, token: string): Router {
  const router = Router();
  router.use(localChannelGuard(token));
  router.get('/', async (req: Request, res: Response) => {
    const q = (name: string) => (typeof req.query[name] === 'string' ? (req.query[name] as string) : undefined);
    const body = await frictionResponse(ctx.db, await ctx.data.snapshot(), 'admin', { mixer: q('mixer'), formula: q('formula'), date: q('date') });
    res.set('Cache-Control', 'no-store').json(body);
  });
  return router;
}
