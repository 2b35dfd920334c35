// The night's work as a chart: one lane per build and per mix, time running left to right.
// On screen the lane names stay put while the hours scroll; on paper one picture fits the page.
import { useLayoutEffect, useRef, useState, type ReactNode } from 'react';
import { chartModel, PALETTE, paletteOf, type ChartRow } from '#shared/sheet/chart';
import type { Sheet, TimelineEntry } from '#shared/sheet/types';
import { Segmented } from '../../../components/segmented.tsx';
import { STEP_WORDS } from '#shared/step-words';
import { dayParts } from '../../../lib/format.ts';

const STEP_WORD = STEP_WORDS;

// Panform's palette, the same as on the printed sheet (shared/sheet/chart.ts).
const fillOf = (e: TimelineEntry): string => paletteOf(e.step).colour;
const textOn = (e: TimelineEntry): string => paletteOf(e.step).ink;

const LABEL_W = 210;
const LANE_H = 36;
const AXIS_H = 46;
const PAD = 70;

interface Layout {
  /** Lanes, time span and "out by" from shared/sheet/chart.ts, as on the printed sheet. */
  rows: ChartRow[];
  start: number;
  end: number;
  ready: number;
  height: number;
}

function layout(sheet: Sheet): Layout {
  const model = chartModel(sheet);
  return { rows: model.rows, start: model.from, end: model.to, ready: model.readyBy, height: AXIS_H + model.rows.length * LANE_H + 8 };
}

function LaneLabels({ l, width, names = true }: { l: Layout; width: number; names?: boolean }) {
  return (
    <>
      {l.rows.map((row, i) => (
        <g key={i} data-lane={names ? row.label : undefined}>
          {i % 2 === 0 && <rect x={0} y={AXIS_H + i * LANE_H} width={width} height={LANE_H} fill="var(--color-sunk)" opacity="0.5" />}
          {names && (
            <text x={8} y={AXIS_H + i * LANE_H + LANE_H / 2 + 5} fontSize="15" fontWeight={row.bars.some((b) => b.window) ? 400 : 700} fill="var(--color-ink)">
              {row.label.length > 24 ? `${row.label.slice(0, 23)}…` : row.label}
            </text>
          )}
        </g>
      ))}
    </>
  );
}

/** The hours, the days and the bars, drawn from `left` with `px` pixels per minute. */
function Bars({ l, left, px, sheet }: { l: Layout; left: number; px: number; sheet: Sheet }) {
  const x = (m: number) => left + (m - l.start) * px;
  const hourStep = px * 60 < 30 ? 3 : px * 60 < 50 ? 2 : 1;
  const ticks: number[] = [];
  for (let m = l.start; m <= l.end; m += 60 * hourStep) ticks.push(m);
  const midnights: number[] = [];
  for (let m = Math.ceil(l.start / 1440) * 1440; m <= l.end; m += 1440) midnights.push(m);
  return (
    <>
      {ticks.map((m) => (
        <g key={m}>
          <line x1={x(m)} x2={x(m)} y1={AXIS_H - 6} y2={l.height} stroke="var(--color-line)" strokeWidth={1} />
          <text x={x(m) + 3} y={AXIS_H - 10} fontSize="13" fill="var(--color-muted)" fontFamily="var(--font-mono)">
            {clock(m)}
          </text>
        </g>
      ))}
      {(midnights.length === 0 || midnights[0] > l.start + 180) && (
        <text x={left + 4} y={16} fontSize="13" fontWeight="700" fill="var(--color-ink)">
          {dayName(l.start, sheet.date)}
        </text>
      )}
      {midnights.map((m) => (
        <g key={`day-${m}`}>
          <line x1={x(m)} x2={x(m)} y1={4} y2={l.height} stroke="var(--color-ink)" strokeWidth={2} opacity={0.6} />
          <text x={x(m) + 4} y={16} fontSize="13" fontWeight="700" fill="var(--color-ink)">
            {dayName(m, sheet.date)}
          </text>
        </g>
      ))}
      {l.rows.flatMap((row, lane) => row.bars.map((bar, k) => ({ bar, lane, key: `${lane}-${k}` }))).map(({ bar, lane, key: i }) => {
        const e = bar.entry;
        const y = AXIS_H + lane * LANE_H + 6;
        const h = LANE_H - 12;
        const x0 = x(bar.from);
        // Cooling past the last bake runs off the edge, as on the printed sheet.
        const w = (Math.min(bar.to, l.end) - bar.from) * px;
        const tip = `${e.label}: ${STEP_WORD[e.step] ?? e.step} ${e.start.slice(11)}–${e.end.slice(11)}${e.temperature !== undefined ? `, ${Math.round(e.temperature)} °C` : ''}${e.window ? ' (window to make it)' : ''}`;
        if (w < 3) {
          return (
            <g key={i} data-step={e.step}>
              <title>{tip}</title>
              <path d={`M${x0} ${y} l5 ${h / 2} l-5 ${h / 2} l-5 ${-h / 2} Z`} fill={fillOf(e)} />
            </g>
          );
        }
        return (
          <g key={i} data-step={e.step}>
            <title>{tip}</title>
            <rect
              x={x0}
              y={y}
              width={w}
              height={h}
              rx={5}
              fill={fillOf(e)}
              stroke={e.window ? 'var(--color-ink)' : 'none'}
              strokeWidth={e.window ? 2 : 0}
              strokeDasharray={e.window ? '5 3' : undefined}
            />
            {w > 52 && (
              <text x={x0 + 5} y={y + h / 2 + 5} fontSize="13" fontWeight="600" fill={textOn(e)}>
                {STEP_WORD[e.step] ?? e.step}
              </text>
            )}
          </g>
        );
      })}
      <line x1={x(l.ready)} x2={x(l.ready)} y1={AXIS_H - 4} y2={l.height} stroke="var(--color-ember)" strokeWidth={3} strokeDasharray="6 4" />
      <text x={x(l.ready) + 4} y={AXIS_H - 24} fontSize="13" fontWeight="700" fill="var(--color-ember)">
        out by {sheet.readyBy.slice(11)}
      </text>
    </>
  );
}

export function TimelineChart({ sheet }: { sheet: Sheet }) {
  const scroller = useRef<HTMLDivElement>(null);
  const [room, setRoom] = useState(900);
  const [zoom, setZoom] = useState<'fit' | 'near'>('fit');
  useLayoutEffect(() => {
    const el = scroller.current;
    if (!el) return;
    const measure = () => setRoom(el.clientWidth);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const l = sheet.timeline.length === 0 ? null : layout(sheet);
  const span = l ? Math.max(60, l.end - l.start) : 60;
  // The whole night fitted to the width, or a close-up of the hours before the first bake.
  const px = zoom === 'near' ? 2.2 : Math.max(0.3, Math.min(3, (room - PAD) / span));
  const readyX = l ? 8 + (l.ready - l.start) * px : 0;
  useLayoutEffect(() => {
    const el = scroller.current;
    if (el) el.scrollLeft = zoom === 'near' ? Math.max(0, readyX - el.clientWidth * 0.8) : 0;
  }, [zoom, readyX]);

  if (!l) return <p className="text-muted">Nothing to schedule.</p>;
  const chartW = span * px + PAD;
  const title = `Timeline: ${l.rows.length} builds and mixes, ${dayName(l.start, sheet.date)} ${clock(l.start)} to ${dayName(l.end, sheet.date)} ${clock(l.end)}`;

  return (
    <figure className="m-0" data-testid="timeline">
      <Segmented
        label="Timeline view"
        options={[
          ['fit', 'Whole night'],
          ['near', 'Close up'],
        ]}
        value={zoom}
        onChange={setZoom}
        className="mb-2 inline-flex print:hidden"
        optionClassName="px-4"
      />
      <div className="flex overflow-hidden rounded-xl border border-line bg-page/40 print:hidden">
        <svg width={LABEL_W} height={l.height} className="shrink-0 border-r border-line" aria-hidden="true" fontFamily="var(--font-sans)">
          <LaneLabels l={l} width={LABEL_W} />
        </svg>
        <div ref={scroller} className="min-w-0 flex-1 overflow-x-auto" tabIndex={0} role="region" aria-label="Timeline hours, scroll sideways">
          <svg role="img" aria-label={title} width={chartW} height={l.height} className="block" fontFamily="var(--font-sans)">
            <LaneLabels l={l} width={chartW} names={false} />
            <Bars l={l} left={8} px={px} sheet={sheet} />
          </svg>
        </div>
      </div>
      <PrintChart>
        <svg viewBox={`0 0 ${LABEL_W + span * 0.6 + PAD} ${l.height}`} className="h-auto w-full" fontFamily="var(--font-sans)" aria-hidden="true">
          <LaneLabels l={l} width={LABEL_W + span * 0.6 + PAD} />
          <Bars l={l} left={LABEL_W} px={0.6} sheet={sheet} />
        </svg>
      </PrintChart>
      <figcaption className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm text-muted">
        {PALETTE.map((p) => (
          <Key key={p.group} color={p.colour} hatch={p.group === 'build'}>
            {p.label}
          </Key>
        ))}
      </figcaption>
    </figure>
  );
}

function PrintChart({ children }: { children: ReactNode }) {
  return <div className="hidden print:block">{children}</div>;
}

function Key({ color, hatch, children }: { color: string; hatch?: boolean; children: ReactNode }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <span
        aria-hidden="true"
        className="inline-block h-3 w-5 rounded-sm"
        style={hatch ? { border: '2px dashed var(--color-ink)', background: color } : { background: color }}
      />
      {children}
    </span>
  );
}

function clock(m: number): string {
  const within = ((m % 1440) + 1440) % 1440;
  return `${String(Math.floor(within / 60)).padStart(2, '0')}:${String(within % 60).padStart(2, '0')}`;
}

/** "Wed 2 Dec": the day that minute `m` (from the plan date's midnight) falls in. */
function dayName(m: number, planDate: string): string {
  const offset = Math.floor(m / 1440);
  const d = new Date(Date.UTC(+planDate.slice(0, 4), +planDate.slice(5, 7) - 1, +planDate.slice(8, 10) + offset));
  const p = dayParts(d.toISOString().slice(0, 10));
  return p ? `${p.weekday.slice(0, 3)} ${p.day} ${p.month.slice(0, 3)}` : '';
}
