// README.md stays short, and every relative link in README.md, DEVELOPERS.md and docs/ leads to a file.
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';

function markdownFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? markdownFiles(join(dir, e.name)) : e.name.endsWith('.md') ? [join(dir, e.name)] : [],
  );
}

const files = ['README.md', 'DEVELOPERS.md', ...markdownFiles('docs')];

describe('documentation', () => {
  it('README.md is under 200 lines', () => {
    expect(readFileSync('README.md', 'utf8').split('\n').length).toBeLessThan(200);
  });

  it.each(files)('every relative link in %s leads to a file', (file) => {
    const text = readFileSync(file, 'utf8');
    const broken = [...text.matchAll(/\]\(([^)\s]+)\)/g)]
      .map((m) => m[1].split('#')[0])
      .filter((target) => target && !/^[a-z]+:/.test(target))
      .filter((target) => !existsSync(join(dirname(file), target)));
    expect(broken).toEqual([]);
  });
});
