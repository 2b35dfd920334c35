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
 * formulas, on mixers and ovens big enough that no order is refused. Returns the plan's path.
 */
export function writeBigPlan(dir, orders = 40) {
  copyDemo(dir, { plans: true });
  const active = demoFormulas().filter((f) => f.status === 'active');
  if (active.length === 0) throw new Error('no active demo formulas in formulas/');
  const customers = ['Harbour Street shop', 'Quay Row shop', 'Lantern Café', 'Gull Steps Café', 'Saltmere school kitchen'];
  const list = [];
  for (let i = 0; i < orders; i++) {
    const f = active[i % active.length];
    list.push({ formula: f.id, pieces: 6 + ((i * 7) % 40), mixer: i % 3 === 0 ? 'small spiral' : 'spiral', customer: customers[i % customers.length] });
  }
  const plan = {
    date: '2026-12-10',
    ready_by: '06:00',
    conditions: { room: '22 °C', flour: '20 °C', tap_water: '12 °C', preferment: '20 °C' },
    mixers: [
      { name: 'spiral', capacity: '60 kg', friction: '13 °C' },
      { name: 'small spiral', capacity: '25 kg', friction: '10 °C' },
    ],
    ovens: [
      { name: 'deck oven', decks: 6, slots: 8, heat: '4 °C/min', cool: '2 °C/min', steam: true, fan: false },
      { name: 'rack oven', decks: 1, slots: 16, heat: '6 °C/min', cool: '3 °C/min', steam: true, fan: true },
    ],
    orders: list,
    notes: 'Bench plan: forty orders for the timing of panform sheet.',
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
