// Two revisions side by side in baker's terms: the figures, each percentage, the builds, the
// process and the plain fields, with what changed marked and the difference in points.
import type { ReactNode } from 'react';
import type { FieldChange, FigureRow, FormulaDiff, LineChange, PartChange, StepChange } from '#shared/diff';
import { formatGrams, formatPercent } from '#shared/units';

const changeTone = { added: 'bg-sage-soft text-sage', removed: 'bg-ember-soft text-ember', changed: 'bg-honey-soft text-honey' } as const;
const changeWord = { added: 'new', removed: 'taken out', changed: 'changed' } as const;

function Mark({ change }: { change: keyof typeof changeTone }) {
  return <span className={`ml-2 inline-block rounded-full px-2 text-sm font-semibold ${changeTone[change]}`}>{changeWord[change]}</span>;
}

const pct = (n: number | null) => (n === null ? '—' : formatPercent(n, 2));
const signed = (n: number, unit: '%' | 'g' | 'points') => {
  const sign = n > 0 ? '+' : n < 0 ? '−' : '±';
  const abs = Math.abs(n);
  if (unit === 'g') return `${sign}${formatGrams(abs)}`;
  return `${sign}${Number(abs.toFixed(2))}${unit === 'points' ? ' pt' : ' %'}`;
};

function SideTable({ caption, head, children }: { caption: ReactNode; head: [string, string, string, string?]; children: ReactNode }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-base">
        <caption className="mb-1 text-left font-display text-lg font-semibold text-crust">{caption}</caption>
        <thead>
          <tr className="border-b-2 border-ink/70 text-left text-xs uppercase tracking-wider text-muted">
            <th scope="col" className="py-1 pr-2">{head[0]}</th>
            <th scope="col" className="figure w-[9rem] border-l-4 border-double border-line py-1 pr-2 text-right">{head[1]}</th>
            <th scope="col" className="figure w-[9rem] border-l-4 border-double border-line py-1 pr-2 text-right">{head[2]}</th>
            {head[3] !== undefined && <th scope="col" className="figure w-[7rem] py-1 pr-2 text-right">{head[3]}</th>}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}

function FigureRows({ rows }: { rows: FigureRow[] }) {
  return (
    <>
      {rows.map((r) => {
        const show = (n: number | null) => (n === null ? '—' : r.unit === 'g' ? formatGrams(n) : formatPercent(n, 2));
        return (
          <tr key={r.key} className={`border-b border-dashed border-line ${r.changed ? 'bg-crumb font-semibold' : 'text-muted'}`}>
            <th scope="row" className="py-1.5 pr-2 text-left font-normal">{r.label}</th>
            <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right">{show(r.before)}</td>
            <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right">{show(r.after)}</td>
            <td className="figure py-1.5 pr-2 text-right">{r.changed && r.delta !== null ? signed(r.delta, r.unit === 'g' ? 'g' : 'points') : ''}</td>
          </tr>
        );
      })}
    </>
  );
}

function LineRows({ lines }: { lines: LineChange[] }) {
  return (
    <>
      {lines.map((l) => (
        <tr key={l.ingredient} className="border-b border-dashed border-line" data-ingredient={l.ingredient}>
          <th scope="row" className="py-1.5 pr-2 text-left font-normal">
            {l.ingredient}
            <Mark change={l.change} />
          </th>
          <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right">{pct(l.before)}</td>
          <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right font-bold">{pct(l.after)}</td>
          <td className="figure py-1.5 pr-2 text-right">{signed(l.delta, 'points')}</td>
        </tr>
      ))}
    </>
  );
}

function FieldRows({ fields }: { fields: FieldChange[] }) {
  return (
    <>
      {fields.map((f) => (
        <tr key={f.field} className="border-b border-dashed border-line align-top">
          <th scope="row" className="py-1.5 pr-2 text-left font-normal">{f.label}</th>
          <td className="border-l-4 border-double border-line py-1.5 pl-2 pr-2 text-muted">{f.before ?? '—'}</td>
          <td className="border-l-4 border-double border-line py-1.5 pl-2 pr-2 font-semibold">{f.after ?? '—'}</td>
        </tr>
      ))}
    </>
  );
}

function PartBlock({ part, what }: { part: PartChange; what: string }) {
  return (
    <div className="space-y-2">
      <h4 className="text-lg font-semibold">
        {what}: {part.name}
        {part.change !== 'changed' && <Mark change={part.change} />}
      </h4>
      {(part.kind || part.share || part.fields.length > 0) && (
        <SideTable caption="Settings" head={['', 'Before', 'After']}>
          {part.kind && (
            <tr className="border-b border-dashed border-line">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">kind</th>
              <td className="border-l-4 border-double border-line py-1.5 pl-2 text-muted">{part.kind.before ?? '—'}</td>
              <td className="border-l-4 border-double border-line py-1.5 pl-2 font-semibold">{part.kind.after ?? '—'}</td>
            </tr>
          )}
          {part.share && (
            <tr className="border-b border-dashed border-line">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">share of the flour</th>
              <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right text-muted">{pct(part.share.before)}</td>
              <td className="figure border-l-4 border-double border-line py-1.5 pr-2 text-right font-semibold">{pct(part.share.after)}</td>
            </tr>
          )}
          <FieldRows fields={part.fields} />
        </SideTable>
      )}
      {part.lines.length > 0 && (
        <SideTable caption="Its lines (% of its flour or of all flour)" head={['Ingredient', 'Before', 'After', 'Change']}>
          <LineRows lines={part.lines} />
        </SideTable>
      )}
    </div>
  );
}

function StepRows({ steps }: { steps: StepChange[] }) {
  return (
    <>
      {steps.map((s, i) => (
        <tr key={i} className="border-b border-dashed border-line align-top">
          <th scope="row" className="py-1.5 pr-2 text-left font-normal">
            {s.step}
            <Mark change={s.change} />
            {s.fields.length > 0 && <span className="block text-sm text-muted">{s.fields.join(', ')}</span>}
          </th>
          <td className="border-l-4 border-double border-line py-1.5 pl-2 pr-2 text-muted">
            {s.beforeIndex !== null && <span className="figure mr-1">{s.beforeIndex}.</span>}
            {s.before ?? '—'}
          </td>
          <td className="border-l-4 border-double border-line py-1.5 pl-2 pr-2 font-semibold">
            {s.afterIndex !== null && <span className="figure mr-1">{s.afterIndex}.</span>}
            {s.after ?? '—'}
          </td>
        </tr>
      ))}
    </>
  );
}

export function RevisionDiffView({ diff, from, to }: { diff: FormulaDiff; from: number; to: number }) {
  const lines = [...diff.flour, ...diff.ingredients];
  const changedFigures = diff.figures.rows.filter((r) => r.changed);
  const nothing =
    diff.change === 'unchanged' ||
    (lines.length === 0 && diff.fields.length === 0 && diff.preferments.length === 0 && diff.soakers.length === 0 && diff.process.length === 0);
  return (
    <div className="space-y-5" data-testid="revision-diff">
      <p className="text-lg">
        <span className="figure font-bold">r{from}</span> (before) beside <span className="figure font-bold">r{to}</span> (after)
        {diff.figures.batchBefore && (
          <span className="text-muted">
            {' '}
            · written batch {diff.figures.batchBefore}
            {diff.figures.batchAfter !== diff.figures.batchBefore && <> → {diff.figures.batchAfter ?? '—'}</>}
          </span>
        )}
      </p>
      {nothing && <p className="rounded-xl bg-sage-soft px-4 py-3 text-sage">No change in baker's terms between these two revisions.</p>}
      {diff.problems.length > 0 && (
        <ul className="list-disc rounded-xl bg-ember-soft py-2 pl-8 pr-3 text-ember">
          {diff.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <SideTable caption={changedFigures.length ? `Figures (${changedFigures.length} changed)` : 'Figures (unchanged)'} head={['Figure', `r${from}`, `r${to}`, 'Change']}>
        <FigureRows rows={diff.figures.rows} />
      </SideTable>
      {lines.length > 0 && (
        <SideTable caption="Baker's percentages" head={['Ingredient', `r${from}`, `r${to}`, 'Change']}>
          <LineRows lines={lines} />
        </SideTable>
      )}
      {diff.fields.length > 0 && (
        <SideTable caption="Yield, temperature and other settings" head={['Setting', `r${from}`, `r${to}`]}>
          <FieldRows fields={diff.fields} />
        </SideTable>
      )}
      {diff.preferments.map((p) => (
        <PartBlock key={`p-${p.name}`} part={p} what="Pre-ferment" />
      ))}
      {diff.soakers.map((s) => (
        <PartBlock key={`s-${s.name}`} part={s} what="Soaker" />
      ))}
      {diff.process.length > 0 && (
        <SideTable caption="Process" head={['Step', `r${from}`, `r${to}`]}>
          <StepRows steps={diff.process} />
        </SideTable>
      )}
    </div>
  );
}
