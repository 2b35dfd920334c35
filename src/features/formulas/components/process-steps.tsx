import type { Step } from '#shared/model';
import { stepWord } from '#shared/step-words';
import { minutes, minutesRange } from '../../../lib/format.ts';
import { useUnits } from '../../../lib/units.ts';

/** The step's trade name, capitalised for a heading; the autolyse says what it is. */
const stepTitle = (step: string) => (step === 'autolyse' ? 'Autolyse (flour and water rest)' : stepWord(step)[0].toUpperCase() + stepWord(step).slice(1));

const vesselWord: Record<string, string> = { deck: 'on the deck', tray: 'on trays', pot: 'in a lidded pot', tin: 'in tins', stone: 'on the stone' };

export function ProcessSteps({ steps }: { steps: Step[] }) {
  const { temperature } = useUnits();
  if (steps.length === 0) return <p className="text-muted">No steps written for this formula.</p>;
  return (
    <ol className="space-y-2 print:columns-2 print:gap-6 print:space-y-0" data-testid="process">
      {steps.map((s, i) => {
        const details: string[] = [];
        if (s.folds) details.push(`${s.folds.count} ${s.folds.count === 1 ? 'fold' : 'folds'}, every ${minutes(s.folds.every)}`);
        if (s.vessel) details.push(vesselWord[s.vessel] ?? s.vessel);
        if (s.covered) details.push(`covered for the first ${minutes(s.covered)}`);
        if (s.steam) details.push('with steam');
        return (
          <li key={i} className="grid grid-cols-[2.25rem_1fr] gap-3 rounded-xl border border-line bg-page/50 p-3 print:break-inside-avoid print:grid-cols-[1.2rem_1fr] print:gap-1 print:border-0 print:p-0 print:pb-0.5">
            <span aria-hidden="true" className="figure grid h-9 w-9 place-items-center rounded-full bg-crust text-on-crust font-bold print:h-auto print:w-auto print:place-items-start print:bg-transparent print:text-ink">
              {i + 1}
            </span>
            <div>
              <p className="flex flex-wrap items-baseline gap-x-3">
                <span className="text-lg font-semibold print:text-[9.5pt]">{stepTitle(s.step)}</span>
                {s.minutes && <span className="figure">{minutesRange(s.minutes)}</span>}
                {s.temperature !== undefined && (
                  <span className={`figure font-bold ${s.step === 'bake' ? 'text-ember' : s.step === 'retard' ? 'text-focus' : ''}`}>{temperature(s.temperature, 0)}</span>
                )}
              </p>
              {details.length > 0 && <p className="text-muted print:inline print:pl-1">{details.join(' · ')}</p>}
              {s.note && <p className="print:inline print:pl-1 print:text-muted">{s.note}</p>}
            </div>
          </li>
        );
      })}
    </ol>
  );
}
