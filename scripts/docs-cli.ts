// `npm run docs:cli`: writes each command's current `--help` into docs/cli/<command>.md.
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { collectCommandHelp, withHelpBlock } from './cli-help.ts';

const pages = await collectCommandHelp();
for (const [name, helps] of pages) {
  const file = `docs/cli/${name}.md`;
  const page = existsSync(file) ? readFileSync(file, 'utf8') : `# panform ${name}\n`;
  const next = withHelpBlock(page, helps);
  if (next !== page) {
    writeFileSync(file, next);
    console.log(`updated ${file}`);
  }
}
