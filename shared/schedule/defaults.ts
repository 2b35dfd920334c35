// Values the scheduler assumes when a plan or formula leaves them out. Each is printed as a
// warning with its source, so the baker knows the night rests on an assumption.
import type { Oven } from '../model.ts';

export interface Assumed<T> {
  value: T;
  source: string;
}

/** Handling seconds per piece for one person (common practice, from memory: a baker at the bench). */
export const DEFAULT_SECONDS_PER_PIECE: Record<'divide' | 'preshape' | 'shape', Assumed<number>> = {
  divide: { value: 8, source: 'common practice (from memory): cutting and weighing one piece by hand' },
  preshape: { value: 6, source: 'common practice (from memory): a loose round or cylinder' },
  shape: { value: 12, source: 'common practice (from memory): a final shape such as a baguette or a batard' },
};

/**
 * Dough one oven slot (a 40 × 60 cm tray or one peel place) takes, g: pieces per slot default to
 * this divided by the piece weight, at least one.
 */
export const SLOT_DOUGH_GRAMS: Assumed<number> = {
  value: 2400,
  source: 'common practice (from memory): about 2.4 kg of dough on a 40 × 60 cm tray or peel place',
};

export const DEFAULT_HEAT_RATE: Assumed<number> = {
  value: 4,
  source: 'common practice (from memory): a deck oven takes about an hour to reach 240 °C',
};
export const DEFAULT_COOL_RATE: Assumed<number> = {
  value: 2,
  source: 'common practice (from memory): a deck left open cools about half as fast as it heats',
};

export const DEFAULT_CLEAN_DOWN_MINUTES: Assumed<number> = {
  value: 15,
  source: 'common practice (from memory): scrape, wash and dry the bowl and hook',
};

/** Minutes a pre-ferment build takes on a mixer. */
export const BUILD_MIX_MINUTES: Assumed<number> = {
  value: 5,
  source: 'common practice (from memory): a build is stirred or mixed on first speed until even',
};

export const DEFAULT_OVEN: Assumed<Oven> = {
  value: { name: 'oven', decks: 3, slots: 6, steam: true, fan: false },
  source: 'assumed so the night can be scheduled: three decks of 6 slots, with steam',
};

/** People and hours assumed when a plan gives no bench shifts. */
export const DEFAULT_BENCH = {
  people: 2,
  hoursBeforeFirstDue: 24,
  source: 'assumed so the night can be scheduled',
};
