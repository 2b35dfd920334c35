// The bake-day page: the sheet's one layout (shared/sheet/layout.ts), item by item in its order,
// as the printed sheet (HTML and PDF) draws it, so the screen and the paper never disagree. The
// cautions and warnings first, the timeline chart, then a section per part of the sheet: build
// cards, a card per mix (MixCard: other parts of the page can hang their own piece on it), the
// pick list and the products. Figures in the reader's units.
import { useMemo, useState, type ReactNode } from 'react';
import type { Sheet, SheetBuild, SheetMix } from '#shared/sheet/types';
import { layoutSheet, type NoticeItem, type SectionItem } from '#shared/sheet/layout';
import type { SheetBlock, SheetTable } from '#shared/sheet/present';
import { useUnitSystem } from '../../../lib/units.ts';
import { TimelineChart } from './timeline-chart.tsx';

export interface BakeDayProps {
  sheet: Sheet;
  /** Minutes from the plan date's midnight, on the plan's clock; null when unknown (print, tests). */
  now: number | null;
  /** Extra parts for a mix's card (the bench's records, for instance), drawn at its foot. */
  mixExtra?: (mix: SheetMix) => ReactNode;
  /** The same for a build's card. */
  buildExtra?: (build: SheetBuild) => ReactNode;
  /** Buttons beside the title. */
  actions?: ReactNode;
  /** Under the sheet's facts (conditions), e.g. proposals from the bench's readings. */
  conditionsExtra?: ReactNode;
  /** Above the sheet's first box, e.g. what waits on this device to be sent. */
  top?: ReactNode;
}

export function BakeDay({ sheet, now, mixExtra, buildExtra, actions, conditionsExtra, top }: BakeDayProps) {
  const units = useUnitSystem();
  const layout = useMemo(() => layoutSheet(sheet, { units }), [sheet, units]);
  const mixOf = useMemo(() => new Map(sheet.mixes.map((m) => [`${m.order}:${m.mixNumber}`, m])), [sheet]);
  return (
    <article data-plan={sheet.date} data-testid="bake-day">
      <header className="mb-5 print:mb-2">
        <title>{`${layout.title} · Panform`}</title>
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <p className="text-sm font-semibold uppercase tracking-[0.14em] text-muted print:text-xs">Bake day</p>
            <h1 className="text-3xl font-bold sm:text-4xl print:text-2xl">{layout.title}</h1>
          </div>
          {actions && <div className="flex flex-wrap gap-2 print:hidden">{actions}</div>}
        </div>
        <ul className="mt-2 space-y-0.5 text-base text-muted print:text-[9pt]" data-testid="conditions">
          {layout.subtitle.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
        {conditionsExtra}
      </header>
      <div className="space-y-4 print:space-y-2">
        {top}
        {layout.items.map((item) =>
          item.kind === 'notice' ? (
            <NoticeBox key={item.key} item={item} />
          ) : item.kind === 'chart' ? (
            <section key={item.key} aria-labelledby="timeline-title" className="min-w-0 rounded-2xl border border-line bg-card p-4 sm:p-5 print:border-0 print:p-0">
              <h2 id="timeline-title" className="mb-3 text-xl font-semibold text-crust">
                {item.title}
              </h2>
              <TimelineChart item={item} sheet={sheet} now={now} />
            </section>
          ) : (
            <Section
              key={item.key}
              item={item}
              mixOf={(b) => (b.mix ? mixOf.get(`${b.mix.order}:${b.mix.mixNumber}`) : undefined)}
              mixExtra={mixExtra}
              buildExtra={(b) => (b.build && buildExtra ? buildExtra(sheet[b.build.list][b.build.index]) : null)}
            />
          ),
        )}
      </div>
    </article>
  );
}

function NoticeBox({ item }: { item: NoticeItem }) {
  const caution = item.key === 'cautions';
  return (
    <section
      aria-labelledby={`${item.key}-title`}
      data-testid={item.key}
      className={`rounded-2xl border-2 px-4 py-3 ${caution ? 'border-ink bg-card' : 'border-dashed border-ember bg-ember-soft'}`}
    >
      <h2 id={`${item.key}-title`} className="mb-1 text-xl font-semibold">
        {item.title}
      </h2>
      <ul className="space-y-1">
        {item.lines.map((l) => (
          <li key={l} className="flex gap-2">
            <span aria-hidden="true" className={`mt-0.5 font-bold ${caution ? 'text-ember' : 'text-ink'}`}>
              {caution ? '▲' : '•'}
            </span>
            <span>{l}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

function Section({
  item,
  mixOf,
  mixExtra,
  buildExtra,
}: {
  item: SectionItem;
  mixOf: (b: SheetBlock) => SheetMix | undefined;
  mixExtra?: (mix: SheetMix) => ReactNode;
  buildExtra: (b: SheetBlock) => ReactNode;
}) {
  const grid = item.key === 'preferments' || item.key === 'soakers' ? 'grid gap-3 lg:grid-cols-2 print:grid-cols-2' : 'grid gap-3';
  return (
    <section aria-labelledby={`${item.key}-title`} data-section={item.key} className="min-w-0 rounded-2xl border border-line bg-card p-4 sm:p-5 print:border-0 print:p-0">
      <h2 id={`${item.key}-title`} className="mb-3 text-xl font-semibold text-crust">
        {item.title}
      </h2>
      <div className={grid}>
        {item.blocks.map((b, i) => {
          const mix = mixOf(b);
          return mix ? <MixCard key={`${mix.order}-${mix.mixNumber}`} block={b} mix={mix} extra={mixExtra?.(mix)} /> : <SheetCard key={`${b.title}-${i}`} block={b} section={item.key} extra={buildExtra(b)} />;
        })}
      </div>
    </section>
  );
}

/** One mix: its weights with tick boxes beside its own steps, the water in large type, the blanks. */
export function MixCard({ block, mix, extra }: { block: SheetBlock; mix: SheetMix; extra?: ReactNode }) {
  return (
    <article className="min-w-0 break-inside-avoid rounded-xl border-2 border-ink/80 bg-page/50 p-3 print:rounded-none" data-testid="sheet-mix" data-mix={`${mix.formula}:${mix.order}:${mix.mixNumber}`}>
      <CardHead block={block} />
      <div className="grid gap-3 md:grid-cols-[minmax(15rem,2fr)_3fr]">
        {block.table && <Table table={block.table} kind="weigh" label={`Weights for ${mix.title}, mix ${mix.mixNumber}`} />}
        {block.steps && <Table table={block.steps} kind="steps" label={`Steps for ${mix.title}, mix ${mix.mixNumber}`} />}
      </div>
      <Blanks block={block} />
      {extra}
    </article>
  );
}

/** A build, a soaker, the pick list or the products table. */
function SheetCard({ block, section, extra }: { block: SheetBlock; section: string; extra?: ReactNode }) {
  const framed = section === 'preferments' || section === 'soakers';
  return (
    <article
      className={`min-w-0 break-inside-avoid ${framed ? 'rounded-xl border border-line bg-page/50 p-3' : ''}`}
      data-testid={framed ? 'sheet-build' : undefined}
    >
      <CardHead block={block} />
      {block.table && <Table table={block.table} kind={section === 'formulas' ? 'summary' : 'weigh'} testId={section === 'totals' ? 'pick-list' : undefined} />}
      <Blanks block={block} />
      {extra}
    </article>
  );
}

function CardHead({ block }: { block: SheetBlock }) {
  return (
    <>
      {block.title && <h3 className="text-xl font-semibold print:text-[10pt]">{block.title}</h3>}
      {block.lines.map((l) => (
        <p key={l} className="text-muted">
          {l}
        </p>
      ))}
      {block.big && block.big.length > 0 && (
        <p className="figure my-1 flex flex-wrap gap-x-6 text-2xl font-bold text-ink">
          {block.big.map((l) => (
            <span key={l}>{l}</span>
          ))}
        </p>
      )}
    </>
  );
}

function Blanks({ block }: { block: SheetBlock }) {
  if (!block.blanks) return null;
  return (
    <p className="mt-2 flex flex-wrap gap-x-8 gap-y-1">
      {block.blanks.map((l) => (
        <span key={l}>{l}</span>
      ))}
    </p>
  );
}

/** A sheet table: figures right-aligned in the figures face, a tick box beside each row to weigh or do. */
function Table({ table, kind, label, testId }: { table: SheetTable; kind: 'weigh' | 'steps' | 'summary'; label?: string; testId?: string }) {
  const tick = table.tick.some(Boolean);
  const [done, setDone] = useState<boolean[]>(() => table.rows.map(() => false));
  const right = (i: number) => table.align[i] === 'right';
  const cell = (i: number) =>
    `py-1 pr-2 align-top ${right(i) ? 'figure text-right' : 'text-left'} ${kind === 'weigh' && right(i) ? 'text-lg font-bold whitespace-nowrap' : ''} ${kind === 'steps' && i === 0 ? 'figure whitespace-nowrap' : ''}`;
  return (
    <div className="min-w-0 overflow-x-auto">
      <table className={`w-full border-collapse ${kind === 'steps' ? 'text-sm' : 'text-base'}`} aria-label={label} data-testid={testId}>
        <thead>
          <tr className="border-b-2 border-ink/70 text-xs uppercase tracking-wider text-muted">
            {table.head.map((h, i) => (
              <th key={i} scope="col" className={`py-1 pr-2 font-semibold ${right(i) ? 'text-right' : 'text-left'}`}>
                {h}
              </th>
            ))}
            {tick && (
              <th scope="col" className="w-10 py-1 text-center font-semibold">
                <span className="sr-only">done</span>✓
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {table.rows.map((r, ri) => (
            <tr key={ri} className={`border-b border-dashed border-line ${done[ri] ? 'bg-sage-soft/60' : ''}`} data-ingredient={kind === 'steps' ? undefined : r[0].trim()}>
              {r.map((c, i) => (
                <td key={i} className={cell(i)} data-weight={kind === 'weigh' && right(i) ? '' : undefined}>
                  {c}
                </td>
              ))}
              {tick && (
                <td className="py-0.5 text-center">
                  {table.tick[ri] && (
                    <input
                      type="checkbox"
                      className="size-6 accent-[var(--color-sage)] print:hidden"
                      aria-label={`${r[0].trim()} ${kind === 'steps' ? r[1] : ''} done`.replace(/\s+/g, ' ')}
                      checked={done[ri] ?? false}
                      onChange={(e) => setDone((d) => d.map((x, k) => (k === ri ? e.target.checked : x)))}
                    />
                  )}
                </td>
              )}
            </tr>
          ))}
        </tbody>
        {table.footer && (
          <tfoot>
            <tr className="border-t-2 border-ink/70 font-bold">
              {table.footer.map((c, i) => (
                <td key={i} className={cell(i)}>
                  {c}
                </td>
              ))}
              {tick && <td />}
            </tr>
          </tfoot>
        )}
      </table>
    </div>
  );
}
