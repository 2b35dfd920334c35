// The night's work as a chart: one lane per build and per mix, time running left to right, in
// the lanes, hours and palette of the printed sheet (shared/sheet/chart.ts, through the layout's
// chart item). Two views, each fitted to the width: the whole night, and the close-up of the
// production morning. A tap, a click or the keyboard focus on a bar shows its times in the row
// under the chart (not a hover tip: a tablet has none); a line marks now; every step is also in a
// plain list in time order, with its fold times.
import { useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { legendOf, paletteOf, type ChartBar, type ChartModel } from '#shared/sheet/chart';
import type { ChartItem } from '#shared/sheet/layout';
import { span } from '#shared/sheet/present';
import { shortTime } from '#shared/sheet/time';
import type { Sheet, TimelineEntry } from '#shared/sheet/types';
import { stepWord } from '#shared/step-words';
import { Segmented } from '../../../components/segmented.tsx';
import { useUnits } from '../../../lib/units.ts';

const LANE_H = 34;
const AXIS_H = 58;
/** Below this many pixels per minute the whole night scrolls sideways instead of squeezing. */
const MIN_PX = 0.2;

type View = 'whole' | 'close';

export interface TimelineChartProps {
  item: ChartItem;
  sheet: Sheet;
  /** Minutes from the plan date's midnight, or null. */
  now: number | null;
}

const within = (m: ChartModel, minute: number | null): minute is number => minute !== null && minute >= m.from && minute <= m.to;

/** The view the page opens on: the close-up when now falls in it, else the whole night. */
export function openingView(item: ChartItem, now: number | null): View {
  return item.closeUp && within(item.closeUp.model, now) ? 'close' : 'whole';
}

export function TimelineChart({ item, sheet, now }: TimelineChartProps) {
  const box = useRef<HTMLDivElement>(null);
  const scroller = useRef<HTMLDivElement>(null);
  const [room, setRoom] = useState(900);
  const [view, setView] = useState<View>(() => openingView(item, now));
  const [picked, setPicked] = useState<ChartBar | null>(null);
  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    const measure = () => setRoom(el.clientWidth);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const model = view === 'close' && item.closeUp ? item.closeUp.model : item.whole;
  const labelW = room < 640 ? 120 : room < 900 ? 160 : 200;
  const spanMin = Math.max(60, model.to - model.from);
  const fitted = (room - labelW - 16) / spanMin;
  // The close-up always fits the width; the whole night too unless that makes it unreadable.
  const px = view === 'close' ? Math.max(0.05, fitted) : Math.max(MIN_PX, fitted);
  const chartW = Math.floor(spanMin * px + 12);
  const height = AXIS_H + model.rows.length * LANE_H + 8;
  // Opens at now when now is in the night, else at the first work (the left edge).
  const nowX = within(model, now) ? 6 + (now - model.from) * px : null;
  useLayoutEffect(() => {
    const el = scroller.current;
    if (el) el.scrollLeft = nowX !== null ? Math.max(0, nowX - el.clientWidth / 3) : 0;
  }, [view, nowX === null, px]); // eslint-disable-line react-hooks/exhaustive-deps

  const title = `Timeline: ${model.rows.length} builds and mixes, ${model.ticks[0]?.day ?? ''} ${clock(model.from)} to ${clock(model.to)}`;
  return (
    <figure className="m-0 min-w-0" data-testid="timeline" data-view={view}>
      <div className="mb-2 flex flex-wrap items-center gap-3 print:hidden">
        {item.closeUp && (
          <Segmented
            label="Timeline view"
            options={[
              ['whole', 'Whole night'],
              ['close', 'Close up'],
            ]}
            value={view}
            onChange={(v) => {
              setView(v);
              setPicked(null);
            }}
            className="inline-flex"
            optionClassName="px-4"
          />
        )}
        {view === 'close' && item.closeUp && <span className="text-muted">{item.closeUp.title}</span>}
        {now !== null && <NowText now={now} sheet={sheet} />}
      </div>
      <div ref={box} className="flex overflow-hidden rounded-xl border border-line bg-page/40 print:hidden">
        <svg width={labelW} height={height} className="shrink-0 border-r border-line" aria-hidden="true" fontFamily="var(--font-sans)">
          <Lanes model={model} width={labelW} labelW={labelW} names />
        </svg>
        <div ref={scroller} className="min-w-0 flex-1 overflow-x-auto" data-testid="timeline-scroller">
          <svg role="group" aria-label={title} width={chartW} height={height} className="block" fontFamily="var(--font-sans)">
            <Lanes model={model} width={chartW} labelW={labelW} names={false} />
            <Bars model={model} left={6} px={px} sheet={sheet} now={now} picked={picked} onPick={setPicked} />
          </svg>
        </div>
      </div>
      <BarDetails bar={picked} sheet={sheet} />
      <PrintChart>
        <svg viewBox={`0 0 ${200 + spanMin * 0.6 + 12} ${height}`} className="h-auto w-full" fontFamily="var(--font-sans)" aria-hidden="true">
          <Lanes model={model} width={200 + spanMin * 0.6 + 12} labelW={200} names />
          <Bars model={model} left={200} px={0.6} sheet={sheet} now={null} picked={null} />
        </svg>
      </PrintChart>
      <figcaption className="mt-2 text-sm text-muted">
        <span className="flex flex-wrap gap-x-4 gap-y-1">
          {legendOf(model).map((p) => (
            <Key key={p.group} color={p.colour} hatch={p.group === 'build'}>
              {p.label}
            </Key>
          ))}
          <Key mark="▼">fold</Key>
          <Key line="var(--color-ember)">first bake out</Key>
          {now !== null && <Key line="var(--color-ink)" dotted>now</Key>}
        </span>
        <span className="mt-1 block">{item.caption} Tap or tab to a bar to see its times.</span>
      </figcaption>
      <StepList sheet={sheet} />
    </figure>
  );
}

function NowText({ now, sheet }: { now: number; sheet: Sheet }) {
  const first = Math.min(...sheet.timeline.map((e) => e.startMinute));
  const last = Math.max(...sheet.timeline.map((e) => e.endMinute));
  // Far from the night (another week's plan): no line to read.
  if (now < first - 720 || now > last + 720) return null;
  const next = sheet.timeline.filter((e) => e.startMinute >= now).sort((a, b) => a.startMinute - b.startMinute)[0];
  const text =
    now < first ? `Now ${clock(now)}: the night starts at ${clock(first)}`
    : now > last ? `Now ${clock(now)}: the night's work is done`
    : `Now ${clock(now)}${next ? `; next: ${next.label}, ${stepWord(next.step)} at ${clock(next.startMinute)}` : ''}`;
  return (
    <span className="font-semibold text-ink" data-testid="now">
      {text}
    </span>
  );
}

function Lanes({ model, width, labelW, names }: { model: ChartModel; width: number; labelW: number; names: boolean }) {
  const chars = Math.floor((labelW - 10) / 7.6);
  return (
    <>
      {model.rows.map((row, i) => (
        <g key={i} data-lane={names ? row.label : undefined}>
          {i % 2 === 0 && <rect x={0} y={AXIS_H + i * LANE_H} width={width} height={LANE_H} fill="var(--color-sunk)" opacity="0.5" />}
          {names && (
            <text x={8} y={AXIS_H + i * LANE_H + LANE_H / 2 + 5} fontSize="14" fontWeight={row.bars.some((b) => b.window) ? 400 : 700} fill="var(--color-ink)">
              {row.label.length > chars ? `${row.label.slice(0, chars - 1)}…` : row.label}
            </text>
          )}
        </g>
      ))}
    </>
  );
}

/** What a bar says in words: the lane, the step and its times. */
function barWords(e: TimelineEntry, date: string): string {
  return `${e.label}: ${stepWord(e.step)} ${span(e.start, e.end, date)}${e.window ? ' (window to make it)' : ''}`;
}

function Bars({
  model,
  left,
  px,
  sheet,
  now,
  picked,
  onPick,
}: {
  model: ChartModel;
  left: number;
  px: number;
  sheet: Sheet;
  now: number | null;
  picked: ChartBar | null;
  onPick?: (b: ChartBar) => void;
}) {
  const x = (m: number) => left + (Math.min(Math.max(m, model.from), model.to) - model.from) * px;
  // Hour labels at least 44 px apart.
  const every = [60, 120, 180, 240, 360, 480].find((s) => s * px >= 44) ?? 720;
  const ticks: number[] = [];
  for (let m = Math.ceil(model.from / every) * every; m <= model.to; m += every) ticks.push(m);
  const days = model.ticks.filter((t) => t.day);
  const right = x(model.to) + 6;
  // A label near the right edge is set to the left of its line, so it is never cut off.
  const readyAnchor = x(model.readyBy) + 96 > right ? 'end' : 'start';
  const keys = (b: ChartBar) => (e: KeyboardEvent) => {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      onPick?.(b);
    }
  };
  return (
    <>
      {ticks.filter((m) => x(m) + 42 <= right).map((m) => (
        <g key={m}>
          <line x1={x(m)} x2={x(m)} y1={AXIS_H - 6} y2={AXIS_H + model.rows.length * LANE_H} stroke="var(--color-line)" strokeWidth={1} />
          <text x={x(m) + 3} y={AXIS_H - 10} fontSize="13" fill="var(--color-muted)" fontFamily="var(--font-mono)">
            {clock(m)}
          </text>
        </g>
      ))}
      {days.map((t) => (
        <text key={`d${t.minute}`} x={x(t.minute) + 3} y={14} fontSize="13" fontWeight="700" fill="var(--color-ink)">
          {t.day}
        </text>
      ))}
      {model.rows.flatMap((row, lane) =>
        row.bars.map((bar, k) => {
          if (bar.to < model.from || bar.from > model.to) return null;
          const e = bar.entry;
          const y = AXIS_H + lane * LANE_H + 5;
          const h = LANE_H - 10;
          const x0 = x(bar.from);
          const w = Math.max(4, x(bar.to) - x0);
          const colour = paletteOf(e.step);
          const on = picked?.entry === e;
          return (
            <g
              key={`${lane}-${k}`}
              data-step={e.step}
              tabIndex={onPick ? 0 : undefined}
              role={onPick ? 'button' : undefined}
              aria-label={onPick ? barWords(e, sheet.date) : undefined}
              aria-pressed={onPick ? on : undefined}
              onClick={onPick ? () => onPick(bar) : undefined}
              onFocus={onPick ? () => onPick(bar) : undefined}
              onKeyDown={onPick ? keys(bar) : undefined}
              className={onPick ? 'cursor-pointer outline-none [&:focus-visible>rect]:stroke-[var(--color-focus)] [&:focus-visible>rect]:stroke-[4]' : undefined}
            >
              <rect
                x={x0}
                y={y}
                width={w}
                height={h}
                rx={4}
                fill={colour.colour}
                stroke={on ? 'var(--color-focus)' : 'var(--color-ink)'}
                strokeWidth={on ? 4 : e.window ? 2 : 0.75}
                strokeDasharray={e.window && !on ? '5 3' : undefined}
              />
              {w > 60 && (
                <text x={x0 + 5} y={y + h / 2 + 5} fontSize="13" fontWeight="600" fill={colour.ink} pointerEvents="none">
                  {w > 120 ? stepWord(e.step) : stepWord(e.step).split(' ')[0]}
                </text>
              )}
              {bar.folds.map((f) => (
                <path key={f} d={`M${x(f) - 5} ${y - 4} h10 l-5 7 z`} fill="var(--color-ink)" pointerEvents="none" />
              ))}
            </g>
          );
        }),
      )}
      {model.readyBy >= model.from && model.readyBy <= model.to && (
        <>
          <line x1={x(model.readyBy)} x2={x(model.readyBy)} y1={AXIS_H - 4} y2={AXIS_H + model.rows.length * LANE_H} stroke="var(--color-ember)" strokeWidth={3} strokeDasharray="6 4" pointerEvents="none" />
          <text x={x(model.readyBy) + (readyAnchor === 'end' ? -4 : 4)} y={AXIS_H - 27} fontSize="13" fontWeight="700" fill="var(--color-ember)" textAnchor={readyAnchor}>
            out by {clock(model.readyBy)}
          </text>
        </>
      )}
      {now !== null && now >= model.from && now <= model.to && (
        <g data-testid="now-line" pointerEvents="none">
          {/* Ink and dotted, with a head: not a colour of any bar (the retard bars are blue). */}
          <line x1={x(now)} x2={x(now)} y1={AXIS_H - 4} y2={AXIS_H + model.rows.length * LANE_H} stroke="var(--color-ink)" strokeWidth={3} strokeDasharray="1 5" strokeLinecap="round" />
          <path d={`M${x(now) - 7} ${AXIS_H - 14} h14 l-7 10 z`} fill="var(--color-ink)" />
          {/* The words for now are above the chart; here only when they do not run into "out by". */}
          {Math.abs(x(now) - x(model.readyBy)) > 110 && (
            <text x={x(now) + (x(now) - left < 90 ? 4 : -4)} y={AXIS_H - 27} fontSize="13" fontWeight="700" fill="var(--color-ink)" textAnchor={x(now) - left < 90 ? 'start' : 'end'}>
              now {clock(now)}
            </text>
          )}
        </g>
      )}
    </>
  );
}

/** The row under the chart: the picked bar's lane, step, times, temperature, place and folds. */
function BarDetails({ bar, sheet }: { bar: ChartBar | null; sheet: Sheet }) {
  const { temperature } = useUnits();
  const e = bar?.entry;
  return (
    <div aria-live="polite" data-testid="bar-details" className="mt-2 min-h-12 rounded-xl border border-line bg-card px-3 py-2 print:hidden">
      {e ? (
        <p>
          <strong>{e.label}</strong> · {stepWord(e.step)}
          {e.window ? ' (a window to make it in)' : ''} · <span className="figure font-bold">{span(e.start, e.end, sheet.date)}</span> ·{' '}
          {minutesText(e.minutes)}
          {e.temperature !== undefined && <> · {temperature(e.temperature, 0)}</>}
          {e.resource && <> · {place(e)}</>}
          {e.folds && e.folds.length > 0 && (
            <>
              {' '}
              · fold at <span className="figure">{e.folds.map((f) => shortTime(f, sheet.date)).join(', ')}</span>
            </>
          )}
        </p>
      ) : (
        <p className="text-muted">Tap a bar, or tab to it, to see its times here.</p>
      )}
    </div>
  );
}

function place(e: TimelineEntry): string {
  const [kind, name] = e.resource!.split(':');
  if (kind === 'bench') return e.unit !== undefined ? `bench, person ${e.unit}` : 'bench';
  return e.unit !== undefined && kind === 'oven' ? `${name} deck ${e.unit}` : (name ?? kind);
}

function minutesText(m: number): string {
  const r = Math.round(m);
  return r < 60 ? `${r} min` : `${Math.floor(r / 60)} h${r % 60 ? ` ${r % 60} min` : ''}`;
}

/** Every step of the night in time order: the chart in words, folds included. */
function StepList({ sheet }: { sheet: Sheet }) {
  const steps = useMemo(() => [...sheet.timeline].sort((a, b) => a.startMinute - b.startMinute || a.label.localeCompare(b.label)), [sheet]);
  return (
    <details className="mt-3 print:hidden" data-testid="step-list">
      <summary className="min-h-12 cursor-pointer py-2 font-semibold text-crust">Every step in time order ({steps.length})</summary>
      <ol className="divide-y divide-dashed divide-line">
        {steps.map((e, i) => (
          <li key={i} className="grid grid-cols-[9rem_1fr] gap-2 py-1.5 sm:grid-cols-[11rem_1fr]">
            <span className="figure font-semibold">{span(e.start, e.end, sheet.date)}</span>
            <span>
              {e.label} · {stepWord(e.step)}
              {e.window ? ' (window)' : ''}
              {e.folds && e.folds.length > 0 && <span className="figure text-muted"> · fold at {e.folds.map((f) => shortTime(f, sheet.date)).join(', ')}</span>}
            </span>
          </li>
        ))}
      </ol>
    </details>
  );
}

function PrintChart({ children }: { children: ReactNode }) {
  return <div className="hidden print:block">{children}</div>;
}

function Key({ color, hatch, mark, line, dotted, children }: { color?: string; hatch?: boolean; mark?: string; line?: string; dotted?: boolean; children: ReactNode }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      {color && (
        <span
          aria-hidden="true"
          className="inline-block h-3 w-5 rounded-sm border border-ink/60"
          style={hatch ? { border: '2px dashed var(--color-ink)', background: color } : { background: color }}
        />
      )}
      {mark && <span aria-hidden="true">{mark}</span>}
      {line && <span aria-hidden="true" className={`inline-block h-4 w-0 border-l-[3px] ${dotted ? 'border-dotted' : ''}`} style={{ borderColor: line }} />}
      {children}
    </span>
  );
}

function clock(m: number): string {
  const w = ((Math.round(m) % 1440) + 1440) % 1440;
  return `${String(Math.floor(w / 60)).padStart(2, '0')}:${String(w % 60).padStart(2, '0')}`;
}

