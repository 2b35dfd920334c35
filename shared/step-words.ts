// The trade's names for the steps of a dough's day, one set for the viewer, the batch sheets
// (text, PDF, the page) and the CLI: bulk fermentation, retard, proof... Pure.

export const STEP_WORDS: Readonly<Record<string, string>> = {
  build: 'build',
  soak: 'soak',
  autolyse: 'autolyse',
  mix: 'mix',
  bulk: 'bulk fermentation',
  fold: 'fold',
  divide: 'divide',
  preshape: 'preshape',
  rest: 'bench rest',
  shape: 'shape',
  proof: 'proof',
  retard: 'retard',
  bake: 'bake',
  cool: 'cool',
  other: 'step',
};

/** A step's name as the trade says it ("bulk" → "bulk fermentation"). */
export function stepWord(step: string): string {
  return STEP_WORDS[step] ?? step;
}
