// Placeholder until its issue lands: the command is listed but says it is not built yet.
import { Command } from 'commander';
import { InputError } from '../errors.ts';

export const command = new Command('sheet').description('(not built yet)').action(() => {
  throw new InputError('panform sheet is not built yet');
});
