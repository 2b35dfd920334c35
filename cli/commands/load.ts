// Placeholder until its issue lands: the command is listed but says it is not built yet.
import { Command } from 'commander';
import { InputError } from '../errors.ts';

export const command = new Command('load').description('(not built yet)').action(() => {
  throw new InputError('panform load is not built yet');
});
