// A throwaway PostgreSQL 15 cluster for the benchmark's server on PostgreSQL: prints one JSON line
// with a new database's URL, and stops the cluster (removing it) when it is told to stop (SIGTERM). Run by bench/run.mjs through tsx.
//   node --import tsx bench/pg-cluster.ts
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { createDatabase, PG_BIN, startCluster } from '../tests/setup/postgres-cluster.ts';

if (!existsSync(join(PG_BIN, 'initdb'))) {
  process.stdout.write(`${JSON.stringify({ unavailable: `PostgreSQL 15 not found at ${PG_BIN}` })}\n`);
  process.exit(0);
}
const cluster = await startCluster();
let stopped = false;
const stop = () => {
  if (stopped) return;
  stopped = true;
  cluster.stop();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
// Kept alive until told to stop.
setInterval(() => {}, 60_000);
process.stdout.write(`${JSON.stringify({ url: await createDatabase(cluster.base) })}\n`);
