// `panform shift`: every task of every plan in the folder that falls in a time window, so the bench
// knows what to do now (tonight's builds for tomorrow, today's mixes, the retards for the day
// after). Reads the plans and builds each one's sheet; the window is cut by shared/schedule/window.ts.
import { Command } from 'commander';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { ShiftTask } from '#shared/schedule/window';
import { localDateTime, minuteOf, parseLocalDateTime } from '#shared/sheet/time';
import { InputError, UsageError } from '../errors.ts';
import { boxTable } from '../print/sheet.ts';
import { defaultFormulasFolder } from '../files.ts';

export interface ShiftOptions {
  folder: string;
  from: string;
  to: string;
  json: boolean;
  catalog?: string;
}

export interface ShiftFlags {
  from?: string;
  to?: string;
  hours?: string;
  json?: boolean;
  catalog?: string;
}

function when(text: string, flag: string): string {
  const t = parseLocalDateTime(text);
  if (!t) throw new UsageError(`--${flag} needs a local date and time "YYYY-MM-DD HH:MM"; got "${text}"`, 'e.g. --from "2026-12-02 18:00"');
  return t;
}

export function toShiftOptions(folder: string | undefined, flags: ShiftFlags): ShiftOptions {
  if (!flags.from) throw new UsageError('give the start of the window with --from', 'e.g. panform shift --from "2026-12-02 18:00" --hours 12');
  const from = when(flags.from, 'from');
  let to: string;
  if (flags.to !== undefined && flags.hours !== undefined) throw new UsageError('--to and --hours both end the window; give one');
  if (flags.to !== undefined) to = when(flags.to, 'to');
  else {
    const hours = Number(flags.hours ?? 12);
    if (!(hours > 0 && hours <= 24 * 14)) throw new UsageError(`--hours must be a number of hours above 0 (at most two weeks); got "${flags.hours}"`);
    to = localDateTime(from.slice(0, 10), minuteOf(from, from.slice(0, 10)) + hours * 60);
  }
  if (to <= from) throw new UsageError(`the window ends (${to}) before it starts (${from})`);
  return { folder: folder ?? defaultFormulasFolder(), from, to, json: Boolean(flags.json), catalog: flags.catalog };
}

/** Builds every plan's sheet in `<folder>/plans` and returns the tasks in the window. */
export async function collectShift(o: ShiftOptions): Promise<ShiftTask[]> {
  const dir = existsSync(join(o.folder, 'plans')) ? join(o.folder, 'plans') : o.folder;
  if (!statSync(dir, { throwIfNoEntry: false })?.isDirectory()) throw new InputError(`no such folder: ${o.folder}`, [], 'give the folder that holds plans/, e.g. formulas');
  const plans = readdirSync(dir).filter((f) => /\.ya?ml$/.test(f)).sort().map((f) => join(dir, f));
  if (plans.length === 0) throw new InputError(`${dir} holds no plan files (*.yaml)`);
  const [{ collectSheet }, { tasksInWindow }] = await Promise.all([import('./sheet.ts'), import('#shared/schedule/window')]);
  const sheets = [];
  for (const p of plans) sheets.push(await collectSheet(p, o.catalog));
  return tasksInWindow(sheets, o.from, o.to);
}

const clock = (t: string) => `${t.slice(5, 10)} ${t.slice(11, 16)}`;

export function renderShiftText(tasks: ShiftTask[], o: ShiftOptions): string {
  const head = `Tasks from ${clock(o.from)} to ${clock(o.to)} (${o.from.slice(0, 4)}), every plan in ${o.folder}`;
  if (tasks.length === 0) return `${head}\n\nnothing to do in this window\n`;
  const where = (t: ShiftTask) => {
    if (!t.resource) return '';
    if (t.resource.kind === 'oven') return `${t.resource.name} deck ${t.resource.unit}`;
    if (t.resource.kind === 'bench') return `bench, person ${t.resource.unit}`;
    return t.resource.name;
  };
  const rows = tasks.map((t) => [clock(t.start), clock(t.end), t.task, t.what, where(t), t.plan, [t.temperature !== null ? `${t.temperature} °C` : '', t.note ?? ''].filter(Boolean).join('; ')]);
  return `${head}\n\n${boxTable(['start', 'end', 'task', 'what', 'where', 'for the plan of', 'notes'], rows, rows[0].map(() => 'left'))}\n`;
}

export async function runShift(o: ShiftOptions, stdout: NodeJS.WritableStream = process.stdout): Promise<void> {
  const tasks = await collectShift(o);
  stdout.write(o.json ? `${JSON.stringify({ from: o.from, to: o.to, tasks }, null, 2)}\n` : renderShiftText(tasks, o));
}

export const command = new Command('shift')
  .description('every task of every plan in the folder that falls in a time window: what the bench does now')
  .argument('[folder]', 'the folder that holds plans/ (default: formulas, or . when it holds ingredients.yaml)')
  .option('--from <when>', 'start of the window, local "YYYY-MM-DD HH:MM"')
  .option('--to <when>', 'end of the window (default: 12 hours after --from)')
  .option('--hours <n>', 'length of the window in hours, instead of --to')
  .option('--json', 'the tasks as JSON')
  .option('--catalog <file>', 'the ingredient catalog (default: ingredients.yaml in the folder)')
  .addHelpText(
    'after',
    `
Examples:
  panform shift --from "2026-12-02 18:00" --hours 14
  panform shift formulas --from "2026-12-02 10:00" --to "2026-12-02 16:00" --json`,
  )
  .action(async (folder: string | undefined, flags: ShiftFlags) => {
    await runShift(toShiftOptions(folder, flags));
  });
