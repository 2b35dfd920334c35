// Placeholder until its issue lands: the command is listed but says it is not built yet.
import { Command } from 'commander';
import { InputError } from '../errors.ts';

export const command = new Command('serve').description('(not built yet)').action(() => {
  throw new InputError('panform serve is not built yet');
});
