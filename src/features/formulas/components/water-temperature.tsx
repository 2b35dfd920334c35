import { useEffect, useState } from 'react';
import type { Formula } from '#shared/model';
import type { ScaleResult } from '#shared/scale';
import { planWater, type WaterPlan } from '#shared/temperature';
import { readNumber, TextField } from '../../../components/field.tsx';
import { useUnits } from '../../../lib/units.ts';
import { getErrorMessage } from '../../../lib/errors.ts';

/** Usual bakehouse readings to start from; the baker overwrites them with today's. */
const START = { room: '22', flour: '20', friction: '13', tap: '14' };

/** Water weighed at the final mix (outside the builds), g. */
export function finalMixWater(scaled: ScaleResult): number {
  const waterNames = new Set(scaled.overall.filter((l) => l.kind === 'water').map((l) => l.ingredient));
  return scaled.finalDough.filter((l) => l.source === 'ingredient' && waterNames.has(l.ingredient)).reduce((a, l) => a + l.grams, 0);
}

/** `onIce` hears whether the water now takes ice, so the page's cautions can say how to handle it. */
export function WaterTemperatureHelper({ formula, scaled, onIce }: { formula: Formula; scaled: ScaleResult; onIce?: (ice: boolean) => void }) {
  const { grams, temperature } = useUnits();
  const [ddt, setDdt] = useState(String(formula.doughTemperature ?? 25));
  const [room, setRoom] = useState(START.room);
  const [flour, setFlour] = useState(START.flour);
  const [friction, setFriction] = useState(START.friction);
  const [tap, setTap] = useState(START.tap);
  const [pre, setPre] = useState<string[]>(() => formula.preferments.map((p) => String(p.ripenTemperature ?? p.temperature ?? 20)));

  const water = finalMixWater(scaled);
  const values = [ddt, room, flour, friction, tap, ...pre].map(readNumber);
  const missing = values.some((v) => v === null);

  let plan: WaterPlan | null = null;
  let problem: string | null = null;
  if (!missing) {
    const [d, r, f, fr, t, ...p] = values as number[];
    try {
      plan = planWater({ ddt: d, room: r, flour: f, friction: fr, preferments: p, tap: t, waterGrams: water });
    } catch (error) {
      problem = getErrorMessage(error);
    }
  }
  const takesIce = plan !== null && plan.ice !== null && plan.ice > 0;
  useEffect(() => onIce?.(takesIce), [onIce, takesIce]);
  const factors = 3 + formula.preferments.length;

  return (
    <div data-testid="water-helper" className="space-y-3">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 xl:grid-cols-2">
        <TextField label="Dough off the mixer" inputMode="decimal" suffix="°C" value={ddt} onChange={(e) => setDdt(e.target.value)} />
        <TextField label="Room" inputMode="decimal" suffix="°C" value={room} onChange={(e) => setRoom(e.target.value)} />
        <TextField label="Flour" inputMode="decimal" suffix="°C" value={flour} onChange={(e) => setFlour(e.target.value)} />
        {formula.preferments.map((p, i) => (
          <TextField
            key={p.name}
            label={p.name[0].toUpperCase() + p.name.slice(1)}
            inputMode="decimal"
            suffix="°C"
            value={pre[i] ?? ''}
            onChange={(e) => setPre((old) => old.map((v, k) => (k === i ? e.target.value : v)))}
          />
        ))}
        <TextField label="Mixer friction" inputMode="decimal" suffix="°C" hint="rise from mixing" value={friction} onChange={(e) => setFriction(e.target.value)} />
        <TextField label="Tap water" inputMode="decimal" suffix="°C" value={tap} onChange={(e) => setTap(e.target.value)} />
      </div>
      <output aria-live="polite" className="block rounded-xl border-2 border-crust bg-crumb p-4" data-testid="water-result">
        {missing && <span>Fill in every temperature.</span>}
        {problem && <span className="font-semibold text-ember">{problem}</span>}
        {plan && (
          <>
            <span className="block text-muted">Water for the final mix ({grams(water)})</span>
            <span className="figure block text-3xl font-bold" data-testid="water-temperature">
              {temperature(plan.waterTemperature)}
            </span>
            {plan.ice !== null && plan.ice > 0 && plan.tapWater !== null && (
              <span className="figure mt-1 block text-xl font-bold text-focus" data-testid="ice">
                ice {grams(plan.ice)} + tap water {grams(plan.tapWater)}
              </span>
            )}
            <span className="figure mt-2 block text-sm text-muted">
              {factors} × {ddt} − ({[room, flour, ...pre, friction].join(' + ')}) = {plan.waterTemperature.toFixed(1)}
            </span>
          </>
        )}
      </output>
      {plan && plan.warnings.length > 0 && (
        <ul className="space-y-1">
          {plan.warnings.map((w) => (
            <li key={w} className={`flex gap-2 ${/scald|harm/.test(w) ? 'font-semibold text-ember' : ''}`}>
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
