// Inputs for the bench, written into a temporary folder: a copy of the demo bakery with a
// 40-order plan, and a folder of 1,000 generated formulas.
import { copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse, stringify } from 'yaml';
import { writeGeneratedFolder } from '../generate-formulas.mjs';

export const DEMO_DIR = 'formulas';

/** The demo formulas (not the catalog), parsed: [{ file, id, status, data }]. */
export function demoFormulas(root = DEMO_DIR) {
  return readdirSync(root)
    .filter((f) => /\.ya?ml$/.test(f) && f !== 'ingredients.yaml')
    .sort()
    .map((file) => {
      const data = parse(readFileSync(join(root, file), 'utf8'));
      return { file, id: data.id, status: data.status, data };
    });
}

/** Copies the demo catalog and formulas (and plans when `plans`) into `dir`. */
export function copyDemo(dir, { plans = false, formulas = true } = {}) {
  mkdirSync(join(dir, 'plans'), { recursive: true });
  copyFileSync(join(DEMO_DIR, 'ingredients.yaml'), join(dir, 'ingredients.yaml'));
  if (formulas) for (const f of demoFormulas()) copyFileSync(join(DEMO_DIR, f.file), join(dir, f.file));
  if (plans && existsSync(join(DEMO_DIR, 'plans'))) {
    for (const f of readdirSync(join(DEMO_DIR, 'plans'))) copyFileSync(join(DEMO_DIR, 'plans', f), join(dir, 'plans', f));
  }
}

/**
 * A copy of the demo bakery with `plans/2026-12-10.yaml`: `orders` orders over the active demo
 * formulas, due from 04:00 on, on `mixers` mixers big enough that no order is refused, `ovens`
 * three-deck ovens and `people` on the bench (a day shift before for the retarded doughs, and the
 * night). Returns the plan's path.
 */
export function writeBigPlan(dir, orders = 40, { mixers = 2, ovens = 2, people = 4 } = {}) {
  copyDemo(dir, { plans: true });
  const active = demoFormulas().filter((f) => f.status === 'active');
  if (active.length === 0) throw new Error('no active demo formulas in formulas/');
  const customers = ['Harbour Street shop', 'Quay Row shop', 'Lantern Café', 'Gull Steps Café', 'Saltmere school kitchen'];
  const names = Array.from({ length: mixers }, (_, i) => (i === mixers - 1 ? 'small spiral' : i === 0 ? 'spiral' : `spiral ${i + 1}`));
  // Due times spread over the morning so the night's ovens can take them: 04:00 onward.
  const span = Math.max(4, Math.ceil(orders / (4 * ovens)));
  const list = [];
  for (let i = 0; i < orders; i++) {
    const f = active[i % active.length];
    const due = 4 * 60 + Math.floor((i * span * 60) / orders / 15) * 15;
    // At most what one round of a three-deck oven holds, so no mix is refused for its size.
    const perSlot = f.data.process?.find((st) => st.step === 'bake')?.per_slot ?? 6;
    list.push({
      formula: f.id,
      pieces: Math.min(6 + ((i * 7) % 40), Math.floor(perSlot * 12)),
      mixer: names[i % names.length],
      due: `${String(Math.floor(due / 60) % 24).padStart(2, '0')}:${String(due % 60).padStart(2, '0')}`,
      customer: customers[i % customers.length],
    });
  }
  const plan = {
    date: '2026-12-10',
    ready_by: '06:00',
    conditions: { room: '22 °C', flour: '20 °C', tap_water: '12 °C', preferment: '20 °C' },
    mixers: names.map((name) => ({ name, capacity: name === 'small spiral' ? '25 kg' : '60 kg', friction: name === 'small spiral' ? '10 °C' : '13 °C' })),
    ovens: Array.from({ length: ovens }, (_, i) => ({ name: `deck oven ${i + 1}`, decks: 3, slots: 4, heat: '4 °C/min', cool: '2 °C/min', steam: true, fan: false })),
    bench: [
      { date: '2026-12-09', from: '08:00', to: '18:00', people: Math.max(1, Math.floor(people / 2)) },
      { date: '2026-12-09', from: '20:00', to: '14:00', people },
    ],
    orders: list,
    notes: `Bench plan: ${orders} orders for the timing of panform sheet.`,
  };
  const path = join(dir, 'plans', '2026-12-10.yaml');
  writeFileSync(path, stringify(plan));
  return path;
}

/**
 * `total` generated formulas in `dir` (bench/generate-formulas.mjs: every shape, valid, within
 * common bakery ranges) with their catalog and a plan. Returns the number of formulas.
 */
export function writeManyFormulas(dir, total = 1000) {
  return writeGeneratedFolder(dir, total, { plan: true }).length;
}
