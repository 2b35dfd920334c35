import type { ReactNode } from 'react';
import type { Sheet, SheetBuild, SheetMix } from '#shared/sheet/types';
import { shortTime } from '#shared/sheet/time';
import { Ledger } from '../../../components/ledger.tsx';
import { hoursRange } from '../../../lib/format.ts';
import { useUnits } from '../../../lib/units.ts';

const kindWord: Record<string, string> = { poolish: 'poolish', biga: 'biga', levain: 'levain', sponge: 'sponge', 'old-dough': 'old dough', other: 'pre-ferment', soaker: 'soaker' };

export function Conditions({ sheet }: { sheet: Sheet }) {
  const { weight, temperature, degrees } = useUnits();
  const c = sheet.conditions;
  return (
    <dl className="flex flex-wrap gap-x-6 gap-y-2 text-lg print:text-[9pt]" data-testid="conditions">
      <Item term="Room" value={temperature(c.room, 0)} />
      <Item term="Flour" value={temperature(c.flour, 0)} />
      <Item term="Tap water" value={temperature(c.tapWater, 0)} />
      {c.preferment !== undefined && <Item term="Pre-ferments (when a build gives none)" value={temperature(c.preferment, 0)} />}
      {sheet.mixers.map((m) => (
        <Item
          key={m.name}
          term={`${m.kind === 'hand' ? 'By hand' : 'Mixer'}: ${m.name}`}
          value={`${weight(m.capacityGrams)} ${m.kind === 'hand' ? 'a person' : 'max'} · rise +${degrees(m.rise)}`}
        />
      ))}
    </dl>
  );
}

function Item({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-sm text-muted">{term}</dt>
      <dd className="figure font-bold">{value}</dd>
    </div>
  );
}

function WaterLine({ temperature, ice, tapWater, water, liquid = 'water' }: { temperature: number | null; ice: number; tapWater: number; water: number; liquid?: string }) {
  const { grams, temperature: shown } = useUnits();
  if (temperature === null) return <span className="text-muted">no target temperature written</span>;
  return (
    <span className="figure">
      {liquid} <strong>{shown(temperature)}</strong>
      {ice > 0 ? (
        <strong className="text-focus">
          {' '}
          · ice {grams(ice)} + tap {grams(tapWater)}
        </strong>
      ) : (
        <> · {grams(water)}</>
      )}
    </span>
  );
}

/** `children`: what goes under the build's lines (the bench's records for it). */
export function BuildCard({ build, date, titleOf, children }: { build: SheetBuild; date: string; titleOf: (id: string) => string; children?: ReactNode }) {
  const { grams, weight, temperature } = useUnits();
  return (
    <article className="break-inside-avoid rounded-xl border border-line bg-page/50 p-3 print:rounded-none print:border-0 print:border-t print:p-0 print:pt-1" data-testid="sheet-build">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-xl font-semibold print:text-[10pt]">
          {build.name}
          {build.batches > 1 && <span className="font-sans text-base font-normal text-muted"> · batch {build.batch} of {build.batches}</span>}
        </h3>
        <span className="text-muted">for {build.formulas.map(titleOf).join(', ')}</span>
      </header>
      <p className="my-1 rounded-lg bg-sage-soft px-2 py-1 text-sage print:bg-transparent print:p-0">
        <span className="font-semibold">Mix </span>
        <span className="figure font-bold">
          {build.mixFrom ? `${shortTime(build.mixFrom, date)} – ${shortTime(build.mixUntil, date)}` : `by ${shortTime(build.mixUntil, date)}`}
        </span>
        {build.hours && (
          <span>
            {' '}
            · {build.kind === 'soaker' ? 'soak' : 'ripen'} {hoursRange(build.hours)}
            {build.holdTemperature !== null && <> at {temperature(build.holdTemperature, 0)}</>}
          </span>
        )}
      </p>
      <p className="mb-1 text-muted">
        {kindWord[build.kind] ?? build.kind} · {weight(build.grams)} ·{' '}
        <WaterLine temperature={build.waterTemperature} ice={build.ice} tapWater={build.tapWater} water={build.water} />
        {build.hot && <strong className="text-ember"> · boiling water</strong>}
      </p>
      <Ledger
        showPercent={false}
        rows={build.ingredients.map((l, i) => ({
          key: `${l.ingredient}-${i}`,
          ingredient: l.ingredient,
          label: l.ingredient,
          weight: grams(l.grams),
          note: l.seed ? 'seed culture' : undefined,
        }))}
        total={{ label: 'Whole build', weight: grams(build.grams) }}
      />
      {build.note && <p className="mt-1 text-sm text-muted">{build.note}</p>}
      {children}
    </article>
  );
}

/** `children`: what goes under the mix's lines (the bench's records for it). */
export function MixCard({ mix, date, children }: { mix: SheetMix; date: string; children?: ReactNode }) {
  const { grams, weight, pieceWeight, temperature } = useUnits();
  return (
    <article className="break-inside-avoid rounded-xl border border-line bg-page/50 p-3 print:rounded-none print:border-0 print:border-t print:p-0 print:pt-1" data-testid="sheet-mix">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-xl font-semibold print:text-[10pt]">
          {mix.title}
          {mix.of > 1 && <span className="font-sans text-base font-normal text-muted"> · mix {mix.mixNumber} of {mix.of}</span>}
        </h3>
        <span className="figure font-bold text-crust">
          {shortTime(mix.start, date)} · {mix.mixer}
        </span>
      </header>
      <p className="mb-1 text-muted">
        {mix.pieces} × {pieceWeight(mix.pieceGrams)} · dough {weight(mix.dough)}
        {mix.customer && <> · for {mix.customer}</>}
      </p>
      <p className="mb-1">
        {mix.doughTemperature !== null && (
          <span className="figure">
            dough{' '}
            {mix.doughTemperatureRange
              ? `${temperature(mix.doughTemperatureRange.min)}–${temperature(mix.doughTemperatureRange.max)} (aim ${temperature(mix.doughTemperature)})`
              : temperature(mix.doughTemperature, 0)}{' '}
            ·{' '}
          </span>
        )}
        <WaterLine
          temperature={mix.waterTemperature}
          ice={mix.ice}
          tapWater={mix.tapWater}
          water={mix.water - (mix.bassinage?.grams ?? 0)}
          liquid={mix.liquid === null || mix.liquid === 'water' ? (mix.bassinage ? 'main water' : 'water') : mix.liquid}
        />
        {mix.bassinage && (
          <span className="figure" data-testid="bassinage">
            {' '}
            · bassinage {grams(mix.bassinage.grams)} at {temperature(mix.bassinage.temperature)}, add late
          </span>
        )}
      </p>
      <Ledger
        showPercent={false}
        rows={mix.ingredients.map((l, i) => ({
          key: `${l.ingredient}-${i}`,
          ingredient: l.ingredient,
          label: l.ingredient,
          weight: grams(l.grams),
          emphasis: l.kind === 'preferment' || l.kind === 'soaker',
        }))}
        total={{ label: 'Mixed dough', weight: grams(mix.dough) }}
      />
      {children}
    </article>
  );
}

export function PickList({ sheet }: { sheet: Sheet }) {
  const { weight } = useUnits();
  return (
    <Ledger
      testId="pick-list"
      showPercent={false}
      weightHeading="Get out"
      rows={sheet.totals.map((l) => ({ key: l.ingredient, ingredient: l.ingredient, label: l.ingredient, weight: weight(l.grams), note: l.kind }))}
    />
  );
}

export function FormulaTotals({ sheet }: { sheet: Sheet }) {
  const { weight } = useUnits();
  return (
    <table className="w-full border-collapse text-lg print:text-[9pt]">
      <thead>
        <tr className="border-b-2 border-ink/70 text-left text-sm uppercase tracking-wider text-muted">
          <th scope="col" className="py-1 pr-2">Product</th>
          <th scope="col" className="figure py-1 pr-2 text-right">Pieces</th>
          <th scope="col" className="figure py-1 pr-2 text-right">Dough</th>
          <th scope="col" className="py-1 pr-2 text-right">Mixes</th>
        </tr>
      </thead>
      <tbody>
        {sheet.formulas.map((f) => (
          <tr key={f.formula} className="border-b border-dashed border-line">
            <th scope="row" className="py-1.5 pr-2 text-left font-semibold">
              {f.title}
            </th>
            <td className="figure py-1.5 pr-2 text-right">{f.pieces}</td>
            <td className="figure py-1.5 pr-2 text-right font-bold">{weight(f.mixedDough)}</td>
            <td className="py-1.5 pr-2 text-right">
              {f.mixes} on {f.mixers.join(', ')}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
