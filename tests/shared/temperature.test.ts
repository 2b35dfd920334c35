// Water temperature, ice and friction, against the published examples (sources beside each value).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeFriction, computeIce, computeWaterTemperature, ICE_CONSTANTS, LATENT_HEAT_OF_FUSION_OF_ICE, planWater, SPECIFIC_HEAT_OF_WATER,
  TemperatureError,
} from '#shared/temperature';
import { celsiusDeltaToFahrenheit, celsiusToFahrenheit, fahrenheitDeltaToCelsius, fahrenheitToCelsius } from '#shared/units';

const C = fahrenheitToCelsius;
const dC = fahrenheitDeltaToCelsius;
const RUNS = Number(process.env.PANFORM_FUZZ_RUNS ?? 500);

describe('the constants', () => {
  it('uses L = 334 J/g and c = 4.18 J/(g·K)', () => {
    expect(LATENT_HEAT_OF_FUSION_OF_ICE).toBe(334); // Case Western Reserve University physics demo "Specific Heat and Heat of Fusion"
    expect(SPECIFIC_HEAT_OF_WATER).toBe(4.18); // same demonstration page
  });
});

describe('computeWaterTemperature', () => {
  // Published worked examples of the n·DDT method, all in °F.
  it.each([
    ['A', { ddt: 80, flour: 65, room: 75, friction: 35, preferments: [] }, 65, 3], // Pizza Today, June 2018 dough column: 65 °F
    ['B', { ddt: 75, flour: 65, room: 65, friction: 8, preferments: [] }, 87, 3], // San Francisco Baking Institute, Artisan I course notes (as quoted on a baker's blog): 87 °F
    ['C', { ddt: 75, flour: 71, room: 71, friction: 20, preferments: [71] }, 67, 4], // Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf": 67 °F
  ])('gives example %s exactly in °F', (_, inputs, water, factors) => {
    const w = computeWaterTemperature(inputs);
    expect(w.water).toBe(water);
    expect(w.factors).toBe(factors);
  });

  it.each([
    ['A', { ddt: C(80), flour: C(65), room: C(75), friction: dC(35), preferments: [] }, 18.333333333333332], // Pizza Today's example in °C, converted by t/°C = (t/°F − 32)/1.8 (NIST SP 811 App. B.9): 18.333 °C
    ['B', { ddt: C(75), flour: C(65), room: C(65), friction: dC(8), preferments: [] }, C(87)], // the SFBI example in °C: (87 − 32)/1.8
    ['C', { ddt: C(75), flour: C(71), room: C(71), friction: dC(20), preferments: [C(71)] }, 19.444444444444443], // Cook's Illustrated's example in °C: (67 − 32)/1.8 = 19.444 °C
  ])('gives example %s in °C to 1e-9 when friction converts as a difference', (_, inputs, water) => {
    expect(Math.abs(computeWaterTemperature(inputs).water - water)).toBeLessThan(1e-9);
  });

  it('gets example A wrong when the friction is converted with the 32° offset', () => {
    const wrong = computeWaterTemperature({ ddt: C(80), flour: C(65), room: C(75), friction: C(35), preferments: [] }).water;
    expect(Math.abs(wrong - C(65))).toBeGreaterThan(1); // the offset must not be applied to a difference
  });

  it('counts one more factor for each pre-ferment', () => {
    const base = { ddt: 25, room: 22, flour: 20, friction: 13 };
    expect(computeWaterTemperature({ ...base, preferments: [] }).factors).toBe(3); // n = 3 without a pre-ferment (Pizza Today, June 2018)
    expect(computeWaterTemperature({ ...base, preferments: [21] }).factors).toBe(4); // n = 4 with one (Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf")
    expect(computeWaterTemperature({ ...base, preferments: [21, 18] }).factors).toBe(5); // by extension: each pre-ferment is a factor
    expect(computeWaterTemperature({ ...base, preferments: [21, 18] }).water).toBe(5 * 25 - (22 + 20 + 13 + 21 + 18)); // 51 °C, by hand
  });

  it('refuses a temperature that is not a number', () => {
    expect(() => computeWaterTemperature({ ddt: Number.NaN, room: 20, flour: 20, friction: 10, preferments: [] })).toThrow(TemperatureError);
  });
});

describe('computeFriction', () => {
  it('gives back the friction of example A from its water', () => {
    expect(computeFriction({ measured: 80, room: 75, flour: 65, water: 65, preferments: [] }).friction).toBe(35); // Pizza Today, June 2018: friction 35 °F
  });

  it('gives back the friction of example C with its starter', () => {
    expect(computeFriction({ measured: 75, room: 71, flour: 71, water: 67, preferments: [71] }).friction).toBe(20); // Cook's Illustrated: stand mixer 20 °F
  });

  it('gives 11.11 °C for example A worked in °C', () => {
    const ff = computeFriction({ measured: C(80), room: C(75), flour: C(65), water: C(65), preferments: [] }).friction;
    expect(Math.abs(ff - 35 / 1.8)).toBeLessThan(1e-9); // Pizza Today's 35 °F-degrees × 5/9 = 19.444 °C-degrees (a difference: no 32° offset)
  });
});

describe('computeIce', () => {
  // Hand-worked from the heat balance (W − I)·c·(T_tap − T_w) = I·L + I·c·T_w with L = 334 J/g and
  // c = 4.18 J/(g·K) (Case Western Reserve University physics demo "Specific Heat and Heat of Fusion").
  it.each([
    [1000, 20, 10, 100.1], // 1000 × 10 / (20 + 79.904) = 100.10 g
    [1000, 25, 5, 190.65], // 1000 × 20 / (25 + 79.904) = 190.65 g
    [650, 18, 10, 53.11], // 650 × 8 / (18 + 79.904) = 53.11 g
    [40000, 20, 10, 4003.83], // 40000 × 10 / (20 + 79.904) = 4003.83 g
  ])('needs the published ice for %d g of water from %d °C tap to %d °C', (water, tap, target, ice) => {
    const r = computeIce(water, tap, target);
    expect(r.ice).toBeCloseTo(ice, 2);
    expect(r.tapWater).toBeCloseTo(water - ice, 2);
  });

  it.each([
    [{ latentHeat: 333.55, specificHeat: 4.18 }, 1000, 20, 10, 100.2], // L = 333.55 J/g (CRC Handbook, from memory): 100.20 g (tap 899.80 g)
    [{ latentHeat: 333.55, specificHeat: 4.18 }, 40000, 20, 10, 4008.15], // L = 333.55 J/g (CRC Handbook, from memory): 4008.15 g
    [{ latentHeat: 334, specificHeat: 4.218 }, 1000, 25, 5, 191.97], // c = 4.218 J/(g·K) at 0 °C (Walstra, Physical Chemistry of Foods, App. I; book from memory): 191.97 g
    [{ latentHeat: 334, specificHeat: 4.218 }, 650, 18, 10, 53.51], // c = 4.218 J/(g·K) at 0 °C (same): 53.51 g
  ])('follows other constants when they are passed in (%o)', (k, water, tap, target, ice) => {
    expect(computeIce(water, tap, target, k).ice).toBeCloseTo(ice, 2);
  });

  it('balances the heat: tap water cooling = ice melting + meltwater warming', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 100000, noNaN: true }),
        fc.double({ min: 0.5, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (W, tap, frac) => {
          const target = tap * frac;
          const { ice, tapWater } = computeIce(W, tap, target);
          const { latentHeat: L, specificHeat: c } = ICE_CONSTANTS;
          const lost = tapWater * c * (tap - target);
          const gained = ice * L + ice * c * target;
          expect(Math.abs(lost - gained)).toBeLessThanOrEqual(1e-9 * Math.max(1, lost));
          expect(ice).toBeGreaterThanOrEqual(0);
          expect(ice).toBeLessThan(W);
        },
      ),
      { numRuns: RUNS },
    );
  });

  it('catches the mistake of leaving out the meltwater warming', () => {
    expect(computeIce(1000, 20, 10, { latentHeat: 333.55, specificHeat: 4.18 }).ice).not.toBeCloseTo(125.3, 0); // leaving out the meltwater's warming gives W·c·ΔT/L = 125.3 g, which is wrong
  });

  it('matches the °F shortcut I/W = (T_tap − T_w)/(T_tap + 112) when L/c is 80', () => {
    const k = { latentHeat: 80, specificHeat: 1 };
    expect(computeIce(1, C(80), C(40), k).iceShare).toBeCloseTo(0.20833, 5); // °F form I/W = (T_tap − T_w)/(T_tap + 112), L/c = 144 °F (144 BTU/lb, Baking Business "Pro Tip: How to keep things cool this summer"): 0.208 33
    expect(computeIce(1, C(70), C(50), k).iceShare).toBeCloseTo(0.10989, 5); // same form: 20/182 = 0.109 89
    expect(computeIce(1, C(60), C(40), k).iceShare).toBeCloseTo(0.11628, 5); // same form: 20/172 = 0.116 28
    expect(computeIce(1, C(75), C(32), k).iceShare).toBeCloseTo(0.22995, 5); // same form: 43/187 = 0.229 95
  });

  it('needs no ice when the tap is cold enough, and never a negative amount', () => {
    expect(computeIce(1000, 10, 15)).toEqual({ ice: 0, tapWater: 1000, iceShare: 0 }); // no ice when the target is at or above the tap's temperature
    expect(computeIce(1000, 10, 10).ice).toBe(0);
  });

  it('refuses water colder than 0 °C: ice at 0 °C cannot reach it', () => {
    expect(() => computeIce(1000, 15, -2)).toThrow(/below the 0 °C that ice can bring it to/); // ice at 0 °C cannot bring water below 0 °C
  });

  it('can bring water all the way to 0 °C with less ice than water', () => {
    const r = computeIce(1000, 20, 0);
    expect(r.ice).toBeLessThan(1000); // I/W = T_tap/(T_tap + L/c) < 1 at T_w = 0, from the heat balance
    expect(r.ice).toBeCloseTo((1000 * 20) / (20 + 334 / 4.18), 9);
  });
});

describe('planWater', () => {
  it('works out the water and the ice for the final dough', () => {
    const p = planWater({ ddt: 26, room: 28, flour: 27, friction: 13, preferments: [24], tap: 22, waterGrams: 6500 });
    expect(p.waterTemperature).toBe(12); // 4·26 − (28 + 27 + 24 + 13) = 12 °C, by hand
    expect(p.factors).toBe(4);
    expect(p.ice).toBeCloseTo((6500 * 10) / (22 + 334 / 4.18), 9); // I = W·(T_tap − T_w)/(T_tap + L/c), L = 334 J/g, c = 4.18 J/(g·K) (Case Western Reserve University demo)
    expect(p.ice! + p.tapWater!).toBeCloseTo(6500, 9);
    expect(p.warnings.join(' ')).toMatch(/ice/);
  });

  it('gives the share of ice when the water weight is not known', () => {
    const p = planWater({ ddt: 24, room: 24, flour: 24, friction: 12, preferments: [], tap: 20 });
    expect(p.ice).toBeNull();
    expect(p.iceShare).toBeCloseTo(8 / (20 + 334 / 4.18), 12);
  });

  it('says when the water must be warmer than the tap', () => {
    const p = planWater({ ddt: 26, room: 20, flour: 18, friction: 10, preferments: [], tap: 12, waterGrams: 1000 });
    expect(p.ice).toBe(0);
    expect(p.tapWater).toBe(1000);
    expect(p.warnings.join(' ')).toMatch(/warmer than the tap/);
  });

  it('refuses a target that needs water below 0 °C, saying what to change', () => {
    expect(() => planWater({ ddt: 22, room: 30, flour: 30, friction: 13, preferments: [] })).toThrow(
      'the water would have to be -7.0 °C, below the 0 °C that ice can bring it to; chill the flour or pre-ferment, or lower the friction',
    );
  });

  it('warns about scalding-hot water', () => {
    const p = planWater({ ddt: 24, room: 5, flour: 5, friction: 5, preferments: [] });
    expect(p.waterTemperature).toBe(57);
    expect(p.warnings.join(' ')).toMatch(/scald/);
  });

  // Common practice: water above about 40 °C is not poured straight onto yeast or a culture;
  // above 50 °C it scalds. Each band gets its own word, and neither below 40 °C.
  it.each([
    [{ ddt: 26, room: 20, flour: 18, friction: 1 }, 39, null],
    [{ ddt: 26, room: 18, flour: 15, friction: 4 }, 41, /too warm to pour straight onto yeast or a culture/],
    [{ ddt: 26, room: 12, flour: 12, friction: 4 }, 50, /too warm to pour straight onto yeast/],
    [{ ddt: 26, room: 12, flour: 11, friction: 4 }, 51, /scald/],
  ])('gives water of the right warmth its own caution (%j → %i °C)', (inputs, water, caution) => {
    const p = planWater({ ...inputs, preferments: [] });
    expect(p.waterTemperature).toBe(water);
    if (caution === null) expect(p.warnings).toEqual([]);
    else expect(p.warnings).toEqual([expect.stringMatching(caution)]);
  });
});

describe('unit invariance of the water temperature method', () => {
  it('gives the same water from °F and °C inputs when friction converts as a difference', () => {
    const t = fc.double({ min: -10, max: 45, noNaN: true });
    fc.assert(
      fc.property(t, t, t, fc.double({ min: 0, max: 30, noNaN: true }), fc.array(t, { maxLength: 3 }), (ddt, room, flour, friction, preferments) => {
        const inC = computeWaterTemperature({ ddt, room, flour, friction, preferments });
        const inF = computeWaterTemperature({
          ddt: celsiusToFahrenheit(ddt),
          room: celsiusToFahrenheit(room),
          flour: celsiusToFahrenheit(flour),
          friction: celsiusDeltaToFahrenheit(friction),
          preferments: preferments.map(celsiusToFahrenheit),
        });
        expect(inF.factors).toBe(inC.factors);
        expect(Math.abs(fahrenheitToCelsius(inF.water) - inC.water)).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });

  it('gives the same friction back from °F and °C measurements', () => {
    const t = fc.double({ min: -10, max: 45, noNaN: true });
    fc.assert(
      fc.property(t, t, t, t, fc.array(t, { maxLength: 3 }), (measured, room, flour, water, preferments) => {
        const inC = computeFriction({ measured, room, flour, water, preferments }).friction;
        const inF = computeFriction({
          measured: celsiusToFahrenheit(measured),
          room: celsiusToFahrenheit(room),
          flour: celsiusToFahrenheit(flour),
          water: celsiusToFahrenheit(water),
          preferments: preferments.map(celsiusToFahrenheit),
        }).friction;
        expect(Math.abs(fahrenheitDeltaToCelsius(inF) - inC)).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });
});
