// docs/cli/<command>.md holds each command's current `--help`; `npm run docs:cli` rewrites it.
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { COMMANDS } from '#cli/command-table';
import { collectCommandHelp, withHelpBlock } from '../../scripts/cli-help.ts';

const pages = await collectCommandHelp();

describe('docs/cli pages', () => {
  it.each(Object.keys(COMMANDS))('docs/cli/%s.md shows the command\'s current --help (run `npm run docs:cli` after changing it)', (name) => {
    const file = `docs/cli/${name}.md`;
    expect(existsSync(file), `${file} is missing`).toBe(true);
    const page = readFileSync(file, 'utf8');
    expect(page).toBe(withHelpBlock(page, pages.get(name)!));
  });

  it('the command index links every command page', () => {
    const index = readFileSync('docs/cli/README.md', 'utf8');
    for (const name of Object.keys(COMMANDS)) expect(index).toContain(`](${name}.md)`);
  });
});
