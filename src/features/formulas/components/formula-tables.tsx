import type { Formula } from '#shared/model';
import type { ScaleResult, ScaledBuild } from '#shared/scale';
import { FigureTile, Ledger } from '../../../components/ledger.tsx';
import { hoursRange, percent } from '../../../lib/format.ts';
import { useUnits } from '../../../lib/units.ts';

const kindWord: Record<string, string> = {
  poolish: 'poolish',
  biga: 'biga',
  levain: 'levain',
  sponge: 'sponge',
  'old-dough': 'old dough',
  other: 'pre-ferment',
  soaker: 'soaker',
};

export function OverallTable({ scaled }: { scaled: ScaleResult }) {
  const { grams } = useUnits();
  return (
    <Ledger
      testId="overall"
      rows={scaled.overall.map((l, i) => ({
        key: `${l.ingredient}-${i}`,
        ingredient: l.ingredient,
        label: l.ingredient,
        percent: percent(l.percent, 2),
        weight: grams(l.grams),
      }))}
      total={{ label: 'Total', percent: percent(scaled.totalPercent, 2), weight: grams(scaled.mixedDough) }}
    />
  );
}

export function BuildTable({ build, formula }: { build: ScaledBuild; formula: Formula }) {
  const { grams, temperature } = useUnits();
  const pre = build.kind === 'soaker' ? undefined : formula.preferments.find((p) => p.name === build.name);
  const soak = build.kind === 'soaker' ? formula.soakers.find((s) => s.name === build.name) : undefined;
  const hours = pre ? pre.ripenHours : soak?.soakHours;
  const hold = pre ? pre.ripenTemperature : soak?.soakTemperature;
  const off = pre?.temperature;
  const hot = soak?.hot ?? false;
  const note = pre?.note ?? soak?.note;
  const hasSeed = build.ingredients.some((l) => l.seed);
  return (
    <div data-testid={`build-${build.name}`} className="break-inside-avoid">
      <h3 className="text-lg font-semibold print:text-[10pt]">
        {build.name} <span className="font-sans text-base font-normal text-muted">({kindWord[build.kind] ?? build.kind})</span>
      </h3>
      <p className="mb-1 text-muted print:text-[8.5pt]">
        {[
          build.share !== undefined ? `${percent(build.share)} of the flour` : null,
          build.flour > 0 ? `${percent(build.hydration)} water to flour` : null,
          hours ? `${build.kind === 'soaker' ? 'soak' : 'ripen'} ${hoursRange(hours)}${hold !== undefined ? ` at ${temperature(hold, 0)}` : ''}` : null,
          off !== undefined ? `off the mixer at ${temperature(off, 0)}` : null,
          hot ? 'made with boiling water' : null,
        ]
          .filter(Boolean)
          .join(' · ')}
      </p>
      <Ledger
        percentHeading={build.kind === 'soaker' ? '% of all flour' : '% of its flour'}
        rows={build.ingredients.map((l, i) => ({
          key: `${l.ingredient}-${i}`,
        ingredient: l.ingredient,
          label: l.ingredient,
          percent: percent(l.percent, 2),
          weight: grams(l.weigh),
          note: l.seed
            ? 'mature culture: its flour and water count in the lines below'
            : hasSeed && Math.abs(l.weigh - l.grams) > 1e-6
              ? `${grams(l.grams)} in the build, less what the seed brings`
              : undefined,
        }))}
        total={{ label: `Whole ${kindWord[build.kind] ?? 'build'}`, weight: grams(build.grams) }}
      />
      {note && <p className="mt-1 text-sm text-muted">{note}</p>}
    </div>
  );
}

export function FinalDoughTable({ scaled }: { scaled: ScaleResult }) {
  const { grams } = useUnits();
  return (
    <Ledger
      testId="final-dough"
      showPercent={false}
      rows={scaled.finalDough.map((l, i) => ({
        key: `${l.ingredient}-${i}`,
        ingredient: l.ingredient,
        label: l.ingredient,
        weight: grams(l.grams),
        emphasis: l.source !== 'ingredient',
        note: l.source === 'preferment' ? 'the whole ripe build' : l.source === 'soaker' ? 'the whole soaker' : undefined,
      }))}
      total={{ label: 'Mixed dough', weight: grams(scaled.mixedDough) }}
    />
  );
}

export function DerivedFigures({ scaled, formula }: { scaled: ScaleResult; formula: Formula }) {
  const { weight, temperature } = useUnits();
  return (
    <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3 xl:grid-cols-2 print:grid-cols-7 print:gap-x-3" data-testid="figures">
      <FigureTile term="Hydration" value={percent(scaled.hydration)} hint="all water ÷ all flour" />
      <FigureTile term="With water in other ingredients" value={percent(scaled.effectiveHydration)} hint="milk, eggs, butter…" />
      <FigureTile term="Pre-fermented flour" value={percent(scaled.prefermentedFlour)} />
      <FigureTile term="Final-mix hydration" value={percent(scaled.finalDoughHydration)} hint="flour and water weighed at the mix" />
      <FigureTile term="All flour" value={weight(scaled.flour)} />
      <FigureTile term="Total of percentages" value={percent(scaled.totalPercent, 2)} className="print:hidden" />
      <FigureTile term="Mixed dough" value={weight(scaled.mixedDough)} className="print:hidden" />
      <FigureTile
        term="Divided dough"
        value={weight(scaled.dividedDough)}
        hint={scaled.loss > 0 ? `${percent(scaled.loss)} allowed for loss` : 'no loss allowed'}
      />
      {formula.doughTemperature !== undefined && <FigureTile term="Dough off the mixer" value={temperature(formula.doughTemperature, 0)} />}
    </dl>
  );
}
