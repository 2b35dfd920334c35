// Child process for load-kill.test.ts: runs `panform load`'s own code path and stops inside the
// load's transaction, telling the parent so, until it is killed.
import { collectLoad } from '../../cli/commands/load.ts';

const [folder, dataDir] = process.argv.slice(2);
await collectLoad({
  paths: [folder],
  data: dataDir || undefined,
  by: 'kill test',
  json: true,
  progress: false,
  async inTransaction() {
    process.stdout.write('paused inside the transaction\n');
    await new Promise(() => setInterval(() => {}, 1000));
  },
});
process.stdout.write('finished (should have been killed)\n');
