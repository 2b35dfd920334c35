import { useEffect, useState } from 'react';
import { FRICTION_CONVENTION, planMixWater, prefermentTemperature, type MixWater } from '#shared/dough-water';
import type { Catalog, Formula, Plan } from '#shared/model';
import type { ScaleResult } from '#shared/scale';
import { formatTemperatureRange, temperatureUnitOf, type TemperatureUnit } from '#shared/units';
import { dayMonth } from '#shared/sheet/time';
import { readNumber, SelectField, TextField } from '../../../components/field.tsx';
import { Button } from '../../../components/button.tsx';
import { temperatureInput, useUnits } from '../../../lib/units.ts';
import type { FrictionProposal } from '../../records/api/types.ts';

/** The readings last typed on this device, kept between visits (they are the bench's, not the file's). */
export const READINGS_KEY = 'panform:water-readings';

export interface Readings {
  /** The bake day whose conditions the readings started from. */
  date: string;
  mixer: string;
  room: string;
  flour: string;
  tap: string;
  /** The mixer's rise, in degrees of `unit`. */
  rise: string;
  /** Pre-ferment temperatures measured tonight, by name; empty: not measured. */
  preferments: Record<string, string>;
  /** The unit the temperatures are typed in (the person's units); missing: °C. */
  unit?: TemperatureUnit;
}

const EMPTY: Readings = { date: '', mixer: '', room: '', flour: '', tap: '', rise: '', preferments: {} };

export function loadReadings(): Readings | null {
  try {
    const raw = typeof window === 'undefined' ? null : window.localStorage.getItem(READINGS_KEY);
    if (!raw) return null;
    const r = JSON.parse(raw) as Partial<Readings>;
    return { ...EMPTY, ...r, preferments: { ...(r.preferments ?? {}) } };
  } catch {
    return null;
  }
}

function saveReadings(r: Readings): void {
  try {
    window.localStorage.setItem(READINGS_KEY, JSON.stringify(r));
  } catch {
    // Private browsing or a full store: the helper still works, it only forgets.
  }
}

/** A typed figure in another unit: a temperature, or a difference (`delta`) such as a mixer's rise. Text that is no number stays as typed. */
function typedIn(text: string, from: TemperatureUnit, to: TemperatureUnit, delta = false): string {
  const n = readNumber(text);
  if (from === to || text.trim() === '' || n === null) return text;
  const [a, b] = [temperatureInput(from), temperatureInput(to)];
  return String(delta ? b.deltaToTyped(a.deltaFromTyped(n)) : b.toTyped(a.fromTyped(n)));
}

/** The readings typed in `to`: those kept in the other unit are converted once (the person changed units). */
export function readingsIn(r: Readings, to: TemperatureUnit): Readings {
  const from = r.unit ?? 'C';
  if (from === to) return r;
  const t = (text: string) => typedIn(text, from, to);
  return {
    ...r,
    unit: to,
    room: t(r.room),
    flour: t(r.flour),
    tap: t(r.tap),
    rise: typedIn(r.rise, from, to, true),
    preferments: Object.fromEntries(Object.entries(r.preferments).map(([name, text]) => [name, t(text)])),
  };
}

/** A bake day's conditions and one of its mixers as readings (the mixer this formula is ordered on, else the first). */
export function readingsFromPlan(plan: Plan, formulaId: string, mixerName?: string): Readings {
  const ordered = plan.orders.find((o) => o.formula === formulaId && o.mixer !== undefined)?.mixer;
  const mixer = plan.mixers.find((m) => m.name === mixerName) ?? plan.mixers.find((m) => m.name === ordered) ?? plan.mixers[0];
  const round = (v: number) => String(Number(v.toFixed(2)));
  return {
    date: plan.date,
    mixer: mixer.name,
    room: round(plan.conditions.room),
    flour: round(plan.conditions.flour),
    tap: round(plan.conditions.tapWater),
    rise: round(mixer.rise),
    preferments: {},
  };
}

/** The first bake day from `today` on, else the latest one; '' without plans. */
export function nextBakeDay(dates: string[], today: string): string {
  const sorted = [...dates].sort();
  return sorted.find((d) => d >= today) ?? sorted[sorted.length - 1] ?? '';
}

export interface BakeDays {
  /** The plans' dates, for the picker. */
  dates: string[];
  /** A bake day's plan once fetched ('' asks for none); the app wires it to the plans API. */
  usePlan: (date: string) => Plan | undefined;
}

/** The friction the bench's records propose for a mixer and formula (GET /api/friction); the app wires it. */
export type UseFriction = (mixer: string, formula: string, date: string) => FrictionProposal | undefined;

const noFriction: UseFriction = () => undefined;

/**
 * `onIce` hears whether the water now takes ice, so the page's cautions can say how to handle it.
 * `useFriction` gives the friction learned from the bench's records: shown with its basis, used
 * only when the baker chooses it; the plan file's rise stays the default.
 */
export function WaterTemperatureHelper({
  formula,
  scaled,
  catalog,
  days,
  onIce,
  useFriction = noFriction,
}: {
  formula: Formula;
  scaled: ScaleResult;
  catalog: Catalog;
  days: BakeDays;
  onIce?: (ice: boolean) => void;
  useFriction?: UseFriction;
}) {
  const { grams, temperature: celsius, degrees, system } = useUnits();
  // Temperatures are typed in the person's units and worked out in °C.
  const { unit, fromTyped, toTyped, deltaFromTyped, deltaToTyped } = temperatureInput(temperatureUnitOf(system));
  const [kept, setReadings] = useState<Readings>(() => loadReadings() ?? EMPTY);
  const readings = readingsIn(kept, unit);
  const [ddtTyped, setDdtTyped] = useState(() => ({ text: formula.doughTemperature === undefined ? '' : String(formula.doughTemperature), unit: 'C' as TemperatureUnit }));
  const ddt = typedIn(ddtTyped.text, ddtTyped.unit, unit);
  const setDdt = (text: string) => setDdtTyped({ text, unit });
  const fromPlan = (p: Plan, mixerName?: string) => readingsIn(readingsFromPlan(p, formula.id, mixerName), unit);
  const chosen = readings.date || nextBakeDay(days.dates, new Date().toISOString().slice(0, 10));
  const plan = days.usePlan(chosen);

  // With nothing kept on this device, start from the first bake day's conditions.
  useEffect(() => {
    if (plan && readings.date === '' && readings.room === '') setReadings(readingsIn(readingsFromPlan(plan, formula.id), unit));
  }, [plan, readings.date, readings.room, formula.id, unit]);

  const update = (next: Readings) => {
    const typed = { ...next, unit };
    setReadings(typed);
    saveReadings(typed);
  };
  const set = (k: 'room' | 'flour' | 'tap' | 'rise') => (e: { target: { value: string } }) => update({ ...readings, [k]: e.target.value });
  const chooseDay = (date: string) => update({ ...readings, date, mixer: '' });
  const chooseMixer = (name: string) => plan && update({ ...fromPlan(plan, name), preferments: readings.preferments });
  const takeDay = () => plan && update({ ...fromPlan(plan, readings.mixer), preferments: readings.preferments });

  // In °C (and °C-degrees for the rise) from here on.
  const typedNumber = (text: string, toC: (v: number) => number) => {
    const n = readNumber(text);
    return n === null ? null : toC(n);
  };
  const values = [
    typedNumber(ddt, fromTyped),
    typedNumber(readings.room, fromTyped),
    typedNumber(readings.flour, fromTyped),
    typedNumber(readings.rise, deltaFromTyped),
    typedNumber(readings.tap, fromTyped),
  ];
  const measured = formula.preferments.map((p) => {
    const text = readings.preferments[p.name] ?? '';
    return text.trim() === '' ? undefined : (typedNumber(text, fromTyped) ?? Number.NaN);
  });
  const missing = values.some((v) => v === null) || measured.some((v) => Number.isNaN(v));

  let water: MixWater | null = null;
  if (!missing) {
    const [d, room, flour, rise, tap] = values as number[];
    water = planMixWater(formula, scaled, catalog, { ddt: d, room, flour, rise, tap, measured, prefermentDefault: plan?.conditions.preferment }, unit);
  }
  const takesIce = water?.main?.ice != null && water.main.ice > 0;
  useEffect(() => onIce?.(takesIce), [onIce, takesIce]);
  const liquidName = water?.liquid && water.liquid.kind === 'other' ? water.liquid.names.join(' and ') : water?.bassinage ? 'main water' : 'water';
  const mixer = plan?.mixers.find((m) => m.name === readings.mixer);
  const proposal = useFriction(readings.mixer, formula.id, chosen);

  return (
    <div data-testid="water-helper" className="space-y-3">
      <div className="grid grid-cols-2 gap-3 print:hidden">
        <SelectField label="Bake day" value={chosen} onChange={(e) => chooseDay(e.target.value)} data-testid="water-day">
          {days.dates.length === 0 && <option value="">no plans loaded</option>}
          {[...days.dates].sort().map((d) => (
            <option key={d} value={d}>
              {d}
            </option>
          ))}
        </SelectField>
        <SelectField label="Mixer" value={readings.mixer} onChange={(e) => chooseMixer(e.target.value)} disabled={!plan} data-testid="water-mixer">
          {!plan && <option value="">—</option>}
          {plan?.mixers.map((m) => (
            <option key={m.name} value={m.name}>
              {m.name}
              {m.kind === 'hand' ? ' (by hand)' : ''}
            </option>
          ))}
        </SelectField>
      </div>
      {plan && readings.date === plan.date && (
        <button type="button" className="text-sm text-focus underline print:hidden" onClick={takeDay}>
          Reset room, flour, tap and mixer to {plan.date}'s conditions
        </button>
      )}
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 xl:grid-cols-2 print:hidden">
        <TextField
          label="Dough off the mixer"
          inputMode="decimal"
          suffix={`°${unit}`}
          hint={formula.doughTemperatureRange && formula.doughTemperatureRange.min !== formula.doughTemperatureRange.max ? `range ${formatTemperatureRange(formula.doughTemperatureRange, unit)}` : undefined}
          value={ddt}
          onChange={(e) => setDdt(e.target.value)}
        />
        <TextField label="Room" inputMode="decimal" suffix={`°${unit}`} value={readings.room} onChange={set('room')} />
        <TextField label="Flour" inputMode="decimal" suffix={`°${unit}`} value={readings.flour} onChange={set('flour')} />
        {formula.preferments.map((p) => {
          const fallback = prefermentTemperature(p, { planDefault: plan?.conditions.preferment, room: values[1] ?? 20 });
          return (
            <TextField
              key={p.name}
              label={`${p.name[0].toUpperCase()}${p.name.slice(1)} tonight`}
              inputMode="decimal"
              suffix={`°${unit}`}
              placeholder={String(Number(toTyped(fallback.temperature)!.toFixed(1)))}
              hint={`empty: its ${fallback.source === 'ripening' ? 'ripening temperature' : fallback.source} (${celsius(fallback.temperature)})`}
              value={readings.preferments[p.name] ?? ''}
              onChange={(e) => update({ ...readings, preferments: { ...readings.preferments, [p.name]: e.target.value } })}
            />
          );
        })}
        <TextField
          label="Mixer rise"
          inputMode="decimal"
          suffix={`°${unit}`}
          hint={mixer?.riseFrom === 'friction' ? `${mixer.name}: straight-dough friction ${degrees(mixer.rise * 3)} ÷ 3` : 'how much warmer dough comes off it'}
          value={readings.rise}
          onChange={set('rise')}
        />
        <TextField label="Tap water" inputMode="decimal" suffix={`°${unit}`} value={readings.tap} onChange={set('tap')} />
      </div>
      {proposal && (
        <FrictionOffer
          proposal={proposal}
          fileRise={mixer?.rise}
          rise={values[3]}
          onUse={(rise) => update({ ...readings, rise: String(Number(deltaToTyped(rise).toFixed(2))) })}
        />
      )}
      <p className={`text-sm text-muted ${missing ? 'print:hidden' : ''}`} data-testid="water-convention">
        By the {FRICTION_CONVENTION} (the dough comes off the mixer at its factors' average plus the rise). Pre-ferments count at the temperature measured tonight, else their ripening temperature.
        {readings.date && <> Readings kept on this device, started from {readings.date}{readings.mixer ? `, ${readings.mixer}` : ''}.</>}
      </p>
      <output
        aria-live="polite"
        className={`block rounded-xl border-2 border-crust bg-crumb p-4 print:border print:p-2 ${missing ? 'print:hidden' : ''}`}
        data-testid="water-result"
      >
        {missing && <span>Fill in every temperature.</span>}
        {water && water.main === null && <span>{water.warnings[0]}</span>}
        {water?.main && (
          <>
            <span className="block text-muted">
              {liquidName[0].toUpperCase() + liquidName.slice(1)} for the final mix ({grams(water.main.grams)})
            </span>
            <span className="figure block text-3xl font-bold print:text-xl" data-testid="water-temperature">
              {celsius(water.main.temperature)}
            </span>
            {water.main.ice !== null && water.main.ice > 0 && water.main.tapWater !== null && (
              <span className="figure mt-1 block text-xl font-bold text-focus" data-testid="ice">
                ice {grams(water.main.ice)} + tap water {grams(water.main.tapWater)}
              </span>
            )}
            {water.bassinage && (
              <span className="figure mt-1 block font-bold" data-testid="water-bassinage">
                held back (bassinage): {grams(water.bassinage.grams)} at {celsius(water.bassinage.temperature)}, add late
              </span>
            )}
            <span className="figure mt-2 block text-sm text-muted" data-testid="water-sum">
              {water.factors} × {celsius(water.desiredDoughTemperature)} − (room {celsius(water.room)} + flour {celsius(water.flour)}
              {water.preferments.map((p) => ` + ${p.name} ${celsius(p.temperature)} (${p.source})`).join('')} + friction{' '}
              {degrees(water.frictionFactor)} = {water.factors} × rise {degrees(water.rise)}) = {celsius(water.liquid!.temperature)}
              {water.bassinage ? ' for all the water' : ''}
            </span>
            {water.liquid?.kind === 'other' && <span className="mt-1 block text-sm text-muted">Specific heat {water.specificHeat}.</span>}
            <span className="mt-1 hidden text-sm print:block">
              Readings: {readings.date ? `${readings.date}, ` : ''}
              {readings.mixer ? `${readings.mixer}, ` : ''}tap {readings.tap} °{unit}.
            </span>
          </>
        )}
      </output>
      {water && water.warnings.length + water.advice.length > 0 && (
        <ul className="space-y-1">
          {[...water.warnings.map((text) => ({ text, strong: true })), ...water.advice.map((text) => ({ text, strong: false }))].map(({ text: w, strong }) => (
            <li key={w} className={`flex gap-2 ${strong ? 'font-semibold text-ember' : ''}`}>
              <span aria-hidden="true" className="text-honey">
                ▲
              </span>
              <span>{w[0].toUpperCase() + w.slice(1)}.</span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** The bench's friction for this mixer and dough, offered beside the file's: never put in by itself. */
function FrictionOffer({ proposal: p, fileRise, rise, onUse }: { proposal: FrictionProposal; fileRise: number | undefined; rise: number | null; onUse: (rise: number) => void }) {
  const { degrees } = useUnits();
  if (p.status === 'too few' || p.rise === null) {
    return (
      <p className="text-sm text-muted print:hidden" data-testid="friction-proposal" data-status={p.status}>
        The bench has recorded {p.mixes} {p.mixes === 1 ? 'mix' : 'mixes'} of this dough on {p.mixer}; a friction is proposed from a few more.
      </p>
    );
  }
  const bench = p.rise;
  const usingBench = rise !== null && Math.abs(rise - bench) < 0.005;
  return (
    <div className="rounded-xl border-2 border-sage bg-sage-soft p-3 print:hidden" data-testid="friction-proposal" data-status={p.status}>
      <p>
        <span className="font-semibold">From the bench's records: </span>
        {p.mixer} rises <strong className="figure whitespace-nowrap">{degrees(bench)}</strong> with this dough, <span data-testid="friction-basis">{p.basis}</span>
.
      </p>
      {p.outliers.length > 0 && (
        <p className="mt-1 text-sm text-muted" data-testid="friction-outliers">
          Left out as far from the rest: {p.outliers.map((o) => `${dayMonth(o.date)} (${degrees(o.rise)})`).join(', ')}.
        </p>
      )}
      {fileRise !== undefined && (
        <p className="mt-1 text-sm text-muted">
          {p.status === 'agrees' ? 'It agrees with the plan file. ' : ''}The plan file's rise, <span className="whitespace-nowrap">{degrees(fileRise)}</span>, stays the default until the file is changed.
        </p>
      )}
      {p.status === 'propose' && (
        <div className="mt-2 flex flex-wrap gap-2">
          {usingBench ? (
            fileRise !== undefined && (
              <Button tone="plain" onClick={() => onUse(fileRise)}>
                Back to the file's {degrees(fileRise)}
              </Button>
            )
          ) : (
            <Button tone="primary" onClick={() => onUse(bench)} data-testid="use-friction">
              Use {degrees(bench)} tonight
            </Button>
          )}
          {usingBench && <span className="self-center font-semibold text-sage">Using the bench's rise.</span>}
        </div>
      )}
    </div>
  );
}
