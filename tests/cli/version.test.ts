import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildCli } from './arithmetic-cli.ts';

describe('panform --version', () => {
  it('prints the version in package.json', async () => {
    const { version } = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
    const r = await (await buildCli()).run(['--version']);
    expect(r).toEqual({ code: 0, stdout: `${version}\n`, stderr: '' });
  });
});
