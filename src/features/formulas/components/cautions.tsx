import type { Formula } from '#shared/model';

/** The usual cautions for this formula's work, and the server's, without repeats. */
export function cautionsFor(formula: Formula, fromServer: string[]): string[] {
  const out = [...fromServer];
  const has = (re: RegExp) => out.some((c) => re.test(c));
  const bake = formula.process.find((s) => s.step === 'bake');
  if (bake && !has(/oven/i)) {
    out.push(`Hot oven${bake.temperature !== undefined ? ` (${Math.round(bake.temperature)} °C)` : ''}: use dry oven gloves and long peels; keep the door path clear.`);
  }
  if (formula.process.some((s) => s.steam) && !has(/steam/i)) {
    out.push('Steam: stand clear of the door when you open a steamed oven; the first burst scalds.');
  }
  if (formula.soakers.some((s) => s.hot) && !has(/boiling|scald/i)) out.push('Scald: boiling water for the soaker; pour it away from you and let it cool covered.');
  if (formula.process.some((s) => s.step === 'retard') && !has(/cold|fridge|retard/i)) {
    out.push('Cold hold: keep the retarder at its set temperature and log it; dough waiting warm is a food-safety risk.');
  }
  if (!has(/local/i)) out.push('Follow your local food-safety, workplace and labelling rules; they come before anything shown here.');
  return out;
}

export function Cautions({ items }: { items: string[] }) {
  return (
    <ul className="space-y-2 print:space-y-0" data-testid="cautions">
      {items.map((c) => (
        <li key={c} className="flex gap-2">
          <span aria-hidden="true" className="mt-0.5 font-bold text-ember">
            ▲
          </span>
          <span>{c}</span>
        </li>
      ))}
    </ul>
  );
}
