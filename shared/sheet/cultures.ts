// The feeds that make each culture ripe for the night's builds: sized back from what the builds
// take plus what is kept back, at the culture's ratio, timed so the culture is ripe at each build.
//
// Rules (docs/batch-sheet.md, "Cultures"):
// - A culture is a seed line of a levain build (a `culture` in the catalog). What a feed makes is
//   what its builds take plus the keep-back (the catalog's feeding.keep, else DEFAULT_KEEP_GRAMS);
//   it is split culture : flour : water by the ratio (feeding.ratio, else 1 : 2 : 2 with the water
//   scaled to the culture's hydration, so the feed keeps it).
// - It ripens feeding.hours at feeding.temperature (else 8-12 h at 24-26 °C, common practice).
//   A feed is ripe from `min` to `max` hours after it; builds whose times are further apart than
//   max − min get feeds of their own (each with its keep-back, which seeds the next).
// - A build takes the culture when it is mixed: its mixer booking, else the start of its window.
// - The feed is aimed at the middle of the hours before its first build, kept within the times
//   that leave it ripe for all its builds.
// Pure; no I/O.
import { lookupIngredient, type Catalog } from '../model.ts';
import { middleOf, type NumberRange } from '../units.ts';
import type { CultureFeed, LocalDateTime, SheetBuild } from './types.ts';
import { compareCodeUnits } from '../text.ts';

/** Ripe culture kept back after the builds, to feed the next day (common practice). */
export const DEFAULT_KEEP_GRAMS = 200;
/** Culture : flour : water at a feed, 1 : 2 : 2 (common practice); the water is scaled to the culture's hydration. */
export const DEFAULT_RATIO: [number, number, number] = [1, 2, 2];
/** Hours to ripe after a feed, and at what temperature (common practice). */
export const DEFAULT_FEED_HOURS: NumberRange = { min: 8, max: 12 };
export const DEFAULT_FEED_TEMPERATURE: NumberRange = { min: 24, max: 26 };

interface Use {
  build: string;
  formula: string;
  grams: number;
  minute: number;
}

export function cultureFeeds(
  builds: SheetBuild[],
  catalog: Catalog,
  minuteOf: (t: LocalDateTime) => number,
  at: (minute: number) => LocalDateTime,
): { feeds: CultureFeed[]; warnings: string[] } {
  const uses = new Map<string, Use[]>();
  for (const b of builds) {
    for (const l of b.ingredients) {
      if (!l.seed) continue;
      const list = uses.get(l.ingredient) ?? [];
      list.push({
        build: b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name,
        formula: b.formula,
        grams: l.grams,
        minute: minuteOf(b.booked?.start ?? b.mixFrom ?? b.mixUntil),
      });
      uses.set(l.ingredient, list);
    }
  }
  const feeds: CultureFeed[] = [];
  const warnings: string[] = [];
  for (const [culture, list] of uses) {
    const item = lookupIngredient(catalog, culture);
    const fd = item.feeding ?? {};
    const hydration = item.hydration ?? 100;
    const ratio: [number, number, number] = fd.ratio ?? [DEFAULT_RATIO[0], DEFAULT_RATIO[1], (DEFAULT_RATIO[2] * hydration) / 100];
    const ratioSource = fd.ratio ? 'the catalog' : `default, common practice; water at the culture's ${hydration} % hydration`;
    const hours = fd.hours ?? DEFAULT_FEED_HOURS;
    const temperatureRange = fd.temperatureRange ?? (fd.temperature !== undefined ? { min: fd.temperature, max: fd.temperature } : DEFAULT_FEED_TEMPERATURE);
    const timingSource =
      fd.hours && fd.temperature !== undefined ? 'the catalog' : fd.hours || fd.temperature !== undefined ? 'the catalog; the rest default, common practice' : 'default, common practice';
    const keep = fd.keepGrams ?? DEFAULT_KEEP_GRAMS;
    const keepSource = fd.keepGrams !== undefined ? 'the catalog' : 'default, common practice';
    const flourName = item.fedWith ?? 'flour';
    if (!item.fedWith) warnings.push(`${culture}: the catalog gives no fed_with; the feed says "flour"`);
    // Greedy batches, as for builds: one feed while its uses fit in max − min hours.
    list.sort((a, b) => a.minute - b.minute);
    const batches: Use[][] = [];
    for (const u of list) {
      const cur = batches[batches.length - 1];
      if (cur && u.minute - cur[0].minute <= (hours.max - hours.min) * 60 + 1e-9) cur.push(u);
      else batches.push([u]);
    }
    const total = ratio[0] + ratio[1] + ratio[2];
    batches.forEach((batch, i) => {
      const first = batch[0].minute;
      const last = batch[batch.length - 1].minute;
      const from = last - hours.max * 60;
      const until = first - hours.min * 60;
      const aim = Math.min(until, Math.max(from, first - middleOf(hours) * 60));
      const needed = batch.reduce((a, u) => a + u.grams, 0);
      const grams = needed + keep;
      feeds.push({
        culture, feed: i + 1, feeds: batches.length, needed,
        uses: batch.map((u) => ({ build: u.build, formula: u.formula, grams: u.grams, at: at(u.minute) })),
        keep, keepSource, grams, ratio, ratioSource,
        seed: (grams * ratio[0]) / total,
        flour: { ingredient: flourName, grams: (grams * ratio[1]) / total },
        water: (grams * ratio[2]) / total,
        hours, temperature: middleOf(temperatureRange), temperatureRange, timingSource,
        at: at(aim), from: at(from), until: at(until),
        ripeFrom: at(aim + hours.min * 60), ripeUntil: at(aim + hours.max * 60),
      });
    });
  }
  feeds.sort((a, b) => compareCodeUnits(a.at, b.at));
  return { feeds, warnings };
}
