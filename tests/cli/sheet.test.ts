// `panform sheet` through the built CLI: every format on the demo plan and the fixtures, the PDF
// read back with poppler's pdftotext, the HTML page looked at in headless Chromium, --mail into
// the local outbox, and one clear line for every misuse.
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sheet } from '#shared/sheet/types';
import { sum } from '#shared/scale';
import { formatGrams } from '#shared/units';
import { toSheetOptions } from '../../cli/commands/sheet.ts';
import { UsageError } from '../../cli/errors.ts';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';

const DEMO_PLAN = join('formulas', 'plans', '2026-12-03.yaml');
const HOT_PLAN = join('tests', 'fixtures', 'sheet', 'plans', '2030-07-10.yaml');
const PLANS = [DEMO_PLAN, HOT_PLAN].filter((p) => existsSync(p));
const PDFTOTEXT = '/usr/bin/pdftotext';
const CHROMIUM = '/usr/bin/chromium';

let cli: BuiltCli;
let dir: string;
beforeAll(async () => {
  cli = await buildCli();
  dir = mkdtempSync(join(tmpdir(), 'panform-sheet-'));
});
afterAll(() => {
  cli?.dispose();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const memo = new Map<string, ReturnType<BuiltCli['run']>>();
/** Runs the CLI once per distinct command line: the outputs are read by several tests. */
function run(args: string[]): ReturnType<BuiltCli['run']> {
  const key = JSON.stringify(args);
  let r = memo.get(key);
  if (!r) memo.set(key, (r = cli.run(args)));
  return r;
}

/** Weights as printed ("1 234 g", "56.3 g"), with the thousands space made plain. */
function weightsIn(text: string): string[] {
  const plain = text.replace(/[\u202f\u00a0]/g, ' ');
  return [...plain.matchAll(/(?<![\d.])\d{1,3}(?: \d{3})*(?:\.\d)? g\b/g)].map((m) => m[0]);
}

const LATE_PLAN = join('formulas', 'plans', '2026-12-05.yaml');

describe('panform sheet on a night that cannot be done', () => {
  it('prints the sheet with each late order, its bottleneck and ways out, and exits 1', async () => {
    const r = await run(['sheet', LATE_PLAN]);
    expect(r.code).toBe(1);
    const text = r.stdout.replace(/\s+/g, ' ');
    expect(text).toMatch(/LATE: order 2 \(harbour-ciabatta, 180 pieces for market stall\) is due at 05:00 but can be out at \d\d:\d\d at the earliest/);
    expect(text).toMatch(/Bottleneck: oven "deck oven" is full around/);
    expect(text).toMatch(/Ways out: .*a later due time/);
    expect(r.stderr).toMatch(/orders? cannot be out by the due time/);
    expect(r.stderr).toMatch(/--allow-late/);
  });

  it('exits 0 with --allow-late, and the JSON gives each order its out time and minutes late', async () => {
    const r = await run(['sheet', LATE_PLAN, '--format', 'json', '--allow-late']);
    expect(r.code).toBe(0);
    const sheet = JSON.parse(r.stdout) as Sheet;
    for (const o of sheet.orders) expect(Object.keys(o)).toEqual(['formula', 'pieces', 'due', 'out', 'late']);
    expect(sheet.orders.filter((o) => o.late > 0).length).toBeGreaterThan(0);
    expect(sheet.warnings.filter((w) => w.startsWith('LATE:')).length).toBe(sheet.orders.filter((o) => o.late > 0).length);
  });
});

describe('panform shift', () => {
  it('lists every task of every plan in the window, as a table and as JSON', async () => {
    const r = await run(['shift', 'formulas', '--from', '2026-12-02 10:00', '--hours', '8']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Tasks from 12-02 10:00 to 12-02 18:00/);
    expect(r.stdout).toMatch(/build +│ poolish/);
    const j = await run(['shift', '--from', '2026-12-02 10:00', '--to', '2026-12-02 18:00', '--json']);
    const out = JSON.parse(j.stdout) as { from: string; to: string; tasks: { plan: string; task: string }[] };
    expect(out.from).toBe('2026-12-02T10:00');
    expect(out.tasks.some((t) => t.plan === '2026-12-03' && t.task === 'retard')).toBe(true);
  });

  it.each([
    [['shift'], /give the start of the window with --from/],
    [['shift', '--from', 'tonight'], /--from needs a local date and time/],
    [['shift', '--from', '2026-12-02 10:00', '--to', '2026-12-02 09:00'], /ends .* before it starts/],
  ])('refuses %j with exit 2', async (args, message) => {
    const r = await run(args);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });
});

describe('panform sheet --format json', () => {
  it('books every mix, bench task and bake on a resource, with the keys the issue names', async () => {
    const r = await run(['sheet', DEMO_PLAN, '--format', 'json']);
    const sheet = JSON.parse(r.stdout) as Sheet;
    for (const b of sheet.bookings) {
      expect(Object.keys(b)).toEqual(['resource', 'task', 'formula', 'mix', 'start', 'end', 'slots', 'temperature']);
      expect(Object.keys(b.resource)).toEqual(['kind', 'name', 'unit']);
      expect(['mixer', 'oven', 'bench']).toContain(b.resource.kind);
    }
    const tasks = new Set(sheet.bookings.map((b) => b.task));
    for (const t of ['build', 'mix', 'divide', 'shape', 'bake', 'heat']) expect(tasks).toContain(t);
    expect(new Set(sheet.bookings.filter((b) => b.task === 'bake').map((b) => b.resource.name))).toEqual(new Set(['deck oven', 'rack oven']));
    expect(sheet.orders.every((o) => o.late === 0)).toBe(true);
  });

  it.each(PLANS)('prints the sheet with the keys docs/cli/sheet.md names (%s)', async (plan) => {
    const r = await run(['sheet', plan, '--format', 'json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const sheet = JSON.parse(r.stdout) as Sheet;
    for (const m of sheet.mixes) {
      expect(Object.keys(m)).toEqual(expect.arrayContaining(['formula', 'mixer', 'dough', 'ingredients', 'waterTemperature', 'ice', 'mixNumber', 'of', 'pieces', 'pieceGrams']));
    }
    for (const p of sheet.preferments) expect(Object.keys(p)).toEqual(expect.arrayContaining(['formula', 'name', 'grams', 'ingredients', 'mixFrom', 'mixUntil', 'waterTemperature']));
    for (const t of sheet.totals) expect(Object.keys(t)).toEqual(expect.arrayContaining(['ingredient', 'grams']));
    for (const t of sheet.timeline) expect(Object.keys(t)).toEqual(expect.arrayContaining(['formula', 'step', 'start', 'end', 'minutes']));
    expect(sheet.timeline.every((t) => /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(t.start))).toBe(true);
    // Unrounded: at least one weight has more than one decimal.
    expect(sheet.totals.some((t) => !Number.isInteger(t.grams * 10))).toBe(true);
  });

  it('prints the same with --json', async () => {
    const a = await run(['sheet', HOT_PLAN, '--json']);
    const b = await run(['sheet', HOT_PLAN, '--format', 'json']);
    expect(a.stdout).toBe(b.stdout);
  });
});

describe('panform sheet --format text', () => {
  it('prints builds, mix cards with ice and their steps, the pick list and the cautions', async () => {
    const r = await run(['sheet', HOT_PLAN]);
    expect(r.code).toBe(0);
    for (const heading of ['PRE-FERMENTS TO BUILD', 'SOAKERS', 'MIX CARDS', 'PICK LIST', 'PER PRODUCT', 'CAUTIONS']) expect(r.stdout).toContain(heading);
    expect(r.stdout).toContain('Poolish bread · mix 1 of 2');
    expect(r.stdout).toContain('combined for poolish-bread + poolish-twin');
    expect(r.stdout).toMatch(/as ice +│ +1\u202f382 g/);
    expect(r.stdout).toContain('[ ]');
    expect(r.stdout).toMatch(/does not replace/);
    expect(r.stdout).toMatch(/>> WATER \d+\.\d °C/);
    expect(r.stdout).toMatch(/│ \d\d:\d\d–\d\d:\d\d +│ bake +│ .*deck \d/);
    expect(r.stdout).toContain('dough off the mixer ______ °C');
    // A pipe gets 80 columns.
    expect(Math.max(...r.stdout.split('\n').map((l) => [...l].length))).toBeLessThanOrEqual(80);
  });
});

describe('panform sheet --format csv', () => {
  it('writes one row per weighed line with its section, rounded as printed', async () => {
    const [csv, json] = await Promise.all([run(['sheet', HOT_PLAN, '--format', 'csv']), run(['sheet', HOT_PLAN, '--json'])]);
    expect(csv.code).toBe(0);
    const sheet = JSON.parse(json.stdout) as Sheet;
    const rows = csv.stdout.trim().split('\n');
    expect(rows[0]).toBe('section,formula,name,mix,mixer,ingredient,kind,grams,ice_grams,tap_water_grams,water_celsius,from,until');
    const lines = [...sheet.preferments, ...sheet.soakers].reduce((n, b) => n + b.ingredients.length, 0) + sheet.mixes.reduce((n, m) => n + m.ingredients.length, 0) + sheet.totals.length;
    expect(rows).toHaveLength(lines + 1);
    const sections = new Set(rows.slice(1).map((r) => r.split(',')[0]));
    expect([...sections].sort()).toEqual(['mix', 'preferment', 'soaker', 'total']);
    const water = rows.find((r) => r.startsWith('mix,straight-rolls,') && r.includes(',water,water,'))!.split(',');
    expect(water.slice(7, 11)).toEqual(['9840', '1382', '8458', '6']);
  });
});

// Building a PDF or starting Chromium takes seconds on a busy machine; these limits only stop a hung run.
const SLOW = { timeout: 180_000 };

describe('panform sheet --format pdf', () => {
  it.each(PLANS)('writes a PDF that shows every weight the text format shows (%s)', SLOW, async (plan) => {
    const out = join(dir, `${plan.replace(/\W+/g, '-')}.pdf`);
    const r = await cli.run(['sheet', plan, '--format', 'pdf', '--out', out]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Wrote the pdf batch sheet/);
    const bytes = readFileSync(out);
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    if (!existsSync(PDFTOTEXT)) {
      console.info(`skipped reading the PDF back: ${PDFTOTEXT} is not installed (apt-get install poppler-utils)`);
      return;
    }
    const pdfText = execFileSync(PDFTOTEXT, [out, '-'], { encoding: 'utf8' }).replace(/\u00a0/g, ' ');
    const text = (await run(['sheet', plan])).stdout;
    const expected = new Set(weightsIn(text));
    expect(expected.size).toBeGreaterThan(20);
    const found = new Set(weightsIn(pdfText));
    const missing = [...expected].filter((w) => !found.has(w));
    expect(missing).toEqual([]);
    // Same count of each weight, not only the same set.
    const count = (xs: string[]) => xs.reduce((m, x) => m.set(x, (m.get(x) ?? 0) + 1), new Map<string, number>());
    const inText = count(weightsIn(text));
    const inPdf = count(weightsIn(pdfText));
    for (const [w, n] of inText) expect(inPdf.get(w) ?? 0, w).toBeGreaterThanOrEqual(n);
    expect(pdfText).toMatch(/does not replace/);
    const info = execFileSync('/usr/bin/pdfinfo', [out], { encoding: 'utf8' });
    expect(info).toMatch(/Page size:\s+595\.28 x 841\.89 pts \(A4\)/);
  });

  it('prints the demo day as cards: each mix with its water, its steps and the blanks, in the order of the text sheet', SLOW, async () => {
    const out = join(dir, 'demo-cards.pdf');
    expect((await cli.run(['sheet', DEMO_PLAN, '--format', 'pdf', '--out', out])).code).toBe(0);
    if (!existsSync(PDFTOTEXT)) return;
    const flat = (x: string) => x.replace(/[\u00a0\u202f]/g, ' ');
    const pdfText = flat(execFileSync(PDFTOTEXT, ['-layout', out, '-'], { encoding: 'utf8' }));
    const text = flat((await run(['sheet', DEMO_PLAN])).stdout);
    const sheet = JSON.parse((await run(['sheet', DEMO_PLAN, '--json'])).stdout) as Sheet;
    // One card per mix, titled alike in both, in the same order.
    const titles = [...text.matchAll(/^(.+ · mix \d+ of \d+ · .+ g)$/gm)].map((m) => m[1]);
    expect(titles).toHaveLength(sheet.mixes.length);
    const at = titles.map((t) => pdfText.indexOf(t));
    expect(at.every((i) => i >= 0), titles.filter((_, k) => at[k] < 0).join('; ')).toBe(true);
    expect([...at].sort((a, b) => a - b)).toEqual(at);
    expect(pdfText.match(/dough off the mixer ______ °C/g)).toHaveLength(sheet.mixes.length);
    expect(pdfText.match(/mixed by \(initials\)/g)).toHaveLength(sheet.mixes.length);
    // The water in large type, at the right of each card's title line.
    expect(pdfText.match(/ water \d+\.\d °C *$/gm)?.length).toBe(sheet.mixes.filter((m) => m.waterTemperature !== null).length);
    // Every bake load with its oven and deck; lid minutes where a formula bakes under a lid.
    const loads = sheet.timeline.filter((e) => e.step === 'bake');
    expect(pdfText.match(/deck oven deck \d|rack oven deck \d/g)!.length).toBe(loads.length);
    if (loads.some((e) => e.covered)) expect(pdfText.replace(/\s+/g, ' ')).toMatch(/lid on \d+/);
    // Fewer pages than the 11 the sheet took with its long timeline table (it now also carries the
    // culture feeds, the equipment and the scales).
    expect(execFileSync('/usr/bin/pdfinfo', [out], { encoding: 'utf8' })).toMatch(/Pages:\s+([1-9]|10)\n/);
  });

  it('prints the demo day with its feeding plan, its equipment against the plan and the small weight with its premix', SLOW, async () => {
    const out = join(dir, 'demo-parts.pdf');
    expect((await cli.run(['sheet', DEMO_PLAN, '--format', 'pdf', '--out', out])).code).toBe(0);
    if (!existsSync(PDFTOTEXT)) return;
    const pdfText = execFileSync(PDFTOTEXT, ['-layout', out, '-'], { encoding: 'utf8' }).replace(/[\u00a0\u202f]/g, ' ');
    const sheet = JSON.parse((await run(['sheet', DEMO_PLAN, '--json'])).stdout) as Sheet;
    // The feeding plan: each feed's title and time, the default marked as common practice.
    expect(pdfText).toContain('Cultures to feed');
    // Builds stand three across and their titles may wrap: read in drawing order, line breaks taken out.
    const flatText = execFileSync(PDFTOTEXT, ['-raw', out, '-'], { encoding: 'utf8' }).replace(/[\s\u00a0\u202f]+/g, ' ');
    for (const c of sheet.cultures) expect(flatText).toContain(`${c.culture}${c.feeds > 1 ? ` · feed ${c.feed} of ${c.feeds}` : ''} · ${formatGrams(c.grams)}`);
    expect(pdfText).toMatch(/feed at 2 Dec 01:55/);
    expect(pdfText).toContain('default, common practice');
    // Equipment: each kind with what the night needs and what the plan has.
    expect(pdfText).toContain('Equipment');
    for (const e of sheet.equipment) expect(pdfText).toMatch(new RegExp(`${e.kind === 'couche' ? 'couches' : `${e.kind}s`}\\s+${e.peak}\\s+${e.have}\\s+enough`));
    // The small weight: flagged on its build and given a premix.
    expect(pdfText).toContain('Scales and small weights');
    expect(flatText).toContain('instant yeast (premix)');
    expect(pdfText).toMatch(/premix 1 in 5: weigh 10\.0 g of instant yeast into 40\.0 g of the water/);
    // The finishes in the pick list.
    expect(pdfText).toContain('Finishes: on or under the pieces');
    expect(pdfText).toMatch(/harbour seed mix \(topping\)\s+Saltmere seeded rye\s+8 × 20\.0 g\s+160 g/);
  });

  it('prints one shift: its title names the window, with only that shift\'s cards', SLOW, async () => {
    const out = join(dir, 'night.pdf');
    expect((await cli.run(['sheet', DEMO_PLAN, '--shift', 'night', '--format', 'pdf', '--out', out])).code).toBe(0);
    const night = JSON.parse((await run(['sheet', DEMO_PLAN, '--shift', 'night', '--json'])).stdout) as Sheet;
    expect(night.window).toEqual({ from: '2026-12-03T00:30', to: '2026-12-03T08:00', name: 'night' });
    const evening = JSON.parse((await run(['sheet', DEMO_PLAN, '--from', '2026-12-02 10:00', '--to', '2026-12-02 16:00', '--json'])).stdout) as Sheet;
    expect(evening.mixes.map((m) => m.formula)).toEqual(['country-levain']);
    expect(evening.preferments.length).toBeGreaterThan(0);
    if (!existsSync(PDFTOTEXT)) return;
    const pdfText = execFileSync(PDFTOTEXT, ['-layout', out, '-'], { encoding: 'utf8' });
    expect(pdfText).toContain('Batch sheet · Thursday 3 December 2026 · night 00:30–08:00');
    expect(pdfText).not.toContain('Pre-ferments to build');
    // Blanks on the cards of the mixes made in the window; the country levain, mixed the day before
    // and baked tonight, shows its weights for reference.
    const mixedTonight = night.mixes.filter((m) => m.start >= night.window!.from && m.start < night.window!.to);
    expect(mixedTonight.length).toBe(night.mixes.length - 1);
    expect(pdfText.match(/dough off the mixer ______ °C/g)).toHaveLength(mixedTonight.length);
    expect(pdfText).toContain('weights for reference only');
    const bad = await cli.run(['sheet', DEMO_PLAN, '--shift', 'evening']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('the plan has no shift "evening"; its shifts: day builds, night');
  });

  it('prints on Letter paper with --paper letter', SLOW, async () => {
    const out = join(dir, 'letter.pdf');
    expect((await cli.run(['sheet', HOT_PLAN, '--format', 'pdf', '--paper', 'letter', '--out', out])).code).toBe(0);
    if (!existsSync('/usr/bin/pdfinfo')) return;
    expect(execFileSync('/usr/bin/pdfinfo', [out], { encoding: 'utf8' })).toMatch(/Page size:\s+612 x 792 pts \(letter\)/);
  });
});

describe('panform sheet --format html', () => {
  it('writes a self-contained page with the font, @page size, tick boxes and the chart', SLOW, async () => {
    const out = join(dir, 'sheet.html');
    expect((await cli.run(['sheet', HOT_PLAN, '--format', 'html', '--out', out])).code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toMatch(/@font-face\{font-family:'JetBrains Mono'.*base64,/);
    expect(html).toContain('@page { size: A4 portrait;');
    expect(html).toContain('<svg');
    expect(html).not.toMatch(/<script|src="http|href="http/);
    const text = (await run(['sheet', HOT_PLAN])).stdout;
    const ticks = (text.match(/\[ \]/g) ?? []).length;
    expect((html.match(/aria-label="tick box"/g) ?? []).length).toBe(ticks);
  });

  it.runIf(existsSync(CHROMIUM))('looks right in headless Chromium: the font loads, nothing runs off the page, the chart draws', SLOW, async () => {
    const out = join(dir, 'look.html');
    expect((await cli.run(['sheet', DEMO_PLAN, '--format', 'html', '--out', out])).code).toBe(0);
    const { chromium } = await import('playwright-core');
    const profile = mkdtempSync(join(tmpdir(), 'panform-chromium-'));
    const context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      // A4 at 96 dpi is 794 px wide.
      viewport: { width: 794, height: 1123 },
    });
    try {
      const page = await context.newPage();
      await page.goto(`file://${out}`);
      await page.evaluate(() => document.fonts.ready);
      const look = await page.evaluate(() => ({
        font: document.fonts.check("16px 'JetBrains Mono'"),
        scrollWidth: document.documentElement.scrollWidth,
        clientWidth: document.documentElement.clientWidth,
        bars: document.querySelectorAll('figure.chart svg rect').length,
        svgWidth: document.querySelector('figure.chart svg')!.getBoundingClientRect().width,
        ticks: document.querySelectorAll('td.tick span').length,
        cautions: document.querySelector('.box.cautions')?.textContent ?? '',
        // Weigh tables must not be wider than their block.
        overflowing: [...document.querySelectorAll('table')].filter((t) => t.getBoundingClientRect().right > document.documentElement.clientWidth + 1).length,
      }));
      expect(look.font).toBe(true);
      expect(look.scrollWidth).toBeLessThanOrEqual(look.clientWidth);
      expect(look.overflowing).toBe(0);
      expect(look.bars).toBeGreaterThan(20);
      expect(look.svgWidth).toBeGreaterThan(500);
      expect(look.ticks).toBeGreaterThan(20);
      expect(look.cautions).toMatch(/Allergens: /);
      await page.emulateMedia({ media: 'print' });
      const pdf = await page.pdf({ preferCSSPageSize: true });
      expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
      await page.screenshot({ path: join(dir, 'look.png'), fullPage: true });
    } finally {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    }
  });
});

describe('panform sheet --mail', () => {
  it('sends the PDF sheet into the local outbox when no SMTP server is set', SLOW, async () => {
    const outbox = join(dir, 'outbox');
    const saved = { outbox: process.env.PANFORM_OUTBOX, smtp: process.env.SMTP_URL };
    process.env.PANFORM_OUTBOX = outbox;
    delete process.env.SMTP_URL;
    try {
      const r = await cli.run(['sheet', HOT_PLAN, '--mail', 'ines@tidewater.example']);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/^Sent the batch sheet for 2030-07-10 to ines@tidewater\.example \(no SMTP_URL set: saved in .*\.eml\)\n$/);
      const [file] = readdirSync(outbox);
      const mail = await simpleParser(readFileSync(join(outbox, file)));
      expect(mail.subject).toBe('Batch sheet for Wednesday 10 July 2030');
      expect(mail.attachments[0].filename).toBe('batch-sheet-2030-07-10.pdf');
      expect(mail.attachments[0].content.subarray(0, 5).toString()).toBe('%PDF-');
      expect(mail.text).toContain('PICK LIST');
    } finally {
      if (saved.outbox === undefined) delete process.env.PANFORM_OUTBOX;
      else process.env.PANFORM_OUTBOX = saved.outbox;
      if (saved.smtp !== undefined) process.env.SMTP_URL = saved.smtp;
    }
  });
});

describe('panform sheet misuse and bad input', () => {
  it.each([
    [{ format: 'xml' }, /unknown format "xml"/],
    [{ json: true, format: 'csv' }, /--json and --format csv ask for different formats/],
    [{ mail: 'not-an-address' }, /--mail needs an e-mail address/],
    [{ paper: 'a3' }, /unknown paper "a3"/],
  ])('refuses %j as misuse (exit 2)', (flags, message) => {
    expect(() => toSheetOptions('plan.yaml', flags)).toThrow(UsageError);
    expect(() => toSheetOptions('plan.yaml', flags)).toThrow(message);
  });

  it('turns flags into options', () => {
    expect(toSheetOptions('p.yaml', {})).toEqual({ plan: 'p.yaml', format: 'text', paper: 'a4', out: undefined, mail: undefined, catalog: undefined, allowLate: false });
    expect(toSheetOptions('p.yaml', { json: true, paper: 'Letter', mail: 'ines@tidewater.example', out: 'x', catalog: 'c.yaml', allowLate: true })).toEqual({
      plan: 'p.yaml', format: 'json', paper: 'letter', out: 'x', mail: 'ines@tidewater.example', catalog: 'c.yaml', allowLate: true,
    });
  });

  it.each([
    [['sheet', HOT_PLAN, '--format', 'xml'], 2, /Allowed choices are text, json, csv, html, pdf/],
    [['sheet', 'no/such/plan.yaml'], 1, /no such file: no\/such\/plan\.yaml/],
    [['sheet'], 2, /missing required argument 'plan'/],
  ])('%j exits %i with one clear line', async (args, code, message) => {
    const r = await run(args as string[]);
    expect(r.code).toBe(code);
    expect(r.stderr).toMatch(message);
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
  });

  it('exits 1 and names the formula when an order names one that is not beside plans/', async () => {
    const plan = join(dir, 'lonely', 'plans', '2030-07-10.yaml');
    mkdirSync(join(dir, 'lonely', 'plans'), { recursive: true });
    writeFileSync(plan, readFileSync(HOT_PLAN, 'utf8'));
    const r = await cli.run(['sheet', plan, '--catalog', join('tests', 'fixtures', 'sheet', 'ingredients.yaml')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/unknown formula: straight-rolls/);
  });

  it('exits 1 and says why when a piece is bigger than its mixer', async () => {
    const copy = join(dir, 'small-mixer');
    cpSync(join('tests', 'fixtures', 'sheet'), copy, { recursive: true });
    const plan = join(copy, 'plans', '2030-07-10.yaml');
    writeFileSync(plan, readFileSync(plan, 'utf8').replace('capacity: 10 kg', 'capacity: 0.5 kg'));
    const r = await cli.run(['sheet', plan]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/one piece needs .* more than mixer "small spiral"/);
  });

  it('shows an example in --help', async () => {
    const r = await run(['sheet', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('panform sheet formulas/plans/2026-12-03.yaml --format pdf --out sheet.pdf');
  });
});

describe('the pick list in every format', () => {
  it('adds up to the same total in JSON, text and CSV', async () => {
    const sheet = JSON.parse((await run(['sheet', HOT_PLAN, '--json'])).stdout) as Sheet;
    const total = sum(sheet.totals.map((t) => t.grams));
    const text = (await run(['sheet', HOT_PLAN])).stdout;
    expect(text).toMatch(new RegExp(`│ all +│ +│ +${formatGrams(total)} │`));
    const csv = (await run(['sheet', HOT_PLAN, '--format', 'csv'])).stdout.trim().split('\n').filter((r) => r.startsWith('total,'));
    expect(Math.abs(sum(csv.map((r) => Number(r.split(',')[7]))) - total)).toBeLessThan(csv.length);
  });
});
