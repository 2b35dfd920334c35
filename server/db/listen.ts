// Hearing of loads made through another process: every load ends with NOTIFY on LOADS_CHANNEL in
// its transaction (server/load/write.ts), delivered when it commits. On a PostgreSQL server each
// Panform server keeps one connection LISTENing and drops its data snapshot when a load is
// announced, so every server shows the load at once. On PGlite the folder belongs to one process
// and loads by `panform load` come through that process already: nothing to listen to.
// If the listening connection is lost, the server keeps asking for the newest load every few
// seconds (server/routes/data.ts CHECK_MS) while it connects again.
import type { Pool, PoolClient } from 'pg';
import type { DatabaseHandle } from './client.ts';

export const LOADS_CHANNEL = 'panform_loads';
const RECONNECT_MS = 1_000;

export interface Listening {
  stop(): Promise<void>;
}

export async function listenForLoads(handle: DatabaseHandle, onLoad: () => void, log: (message: string) => void): Promise<Listening> {
  if (handle.kind !== 'postgres') return { stop: async () => {} };
  const pool = (handle.db as unknown as { $client: Pool }).$client;
  let client: PoolClient | null = null;
  let stopped = false;
  let retry: NodeJS.Timeout | null = null;

  const connect = async (): Promise<void> => {
    let c: PoolClient;
    try {
      c = await pool.connect();
    } catch (e) {
      if (!stopped) schedule(e);
      return;
    }
    if (stopped) {
      c.release();
      return;
    }
    const lost = (e: unknown) => {
      if (client !== c) return;
      client = null;
      c.release(true);
      if (!stopped) schedule(e);
    };
    c.on('error', lost);
    c.on('notification', (n) => {
      if (n.channel === LOADS_CHANNEL) onLoad();
    });
    try {
      await c.query(`listen ${LOADS_CHANNEL}`);
    } catch (e) {
      c.release(true);
      if (!stopped) schedule(e);
      return;
    }
    client = c;
    // A load may have committed while nobody listened.
    onLoad();
  };
  const schedule = (e: unknown) => {
    log(`panform serve: lost the database connection that hears of loads (${(e as Error)?.message ?? String(e)}); connecting again`);
    onLoad();
    retry = setTimeout(() => void connect(), RECONNECT_MS);
    retry.unref();
  };

  await connect();
  return {
    async stop() {
      stopped = true;
      if (retry) clearTimeout(retry);
      const c = client;
      client = null;
      if (c) {
        try {
          await c.query(`unlisten ${LOADS_CHANNEL}`);
        } catch {
          // the connection is going anyway
        }
        c.release();
      }
    },
  };
}
