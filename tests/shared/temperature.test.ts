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
  it('uses the published L = 333.55 J/g and c = 4.186 J/(g·K)', () => {
    // CRC Handbook of Chemistry and Physics, "Enthalpy of fusion": water 6.01 kJ/mol at 0 °C; ÷ 18.015 g/mol = 333.6 J/g (from memory)
    expect(LATENT_HEAT_OF_FUSION_OF_ICE).toBe(333.55);
    expect(Math.abs(6010 / 18.015 - LATENT_HEAT_OF_FUSION_OF_ICE)).toBeLessThan(0.1);
    // NIST SP 811 (2008), Appendix B.8: calorie (15 °C) = 4.1855 J, the heat that warms 1 g of water by 1 K at 15 °C
    expect(SPECIFIC_HEAT_OF_WATER).toBe(4.186);
    expect(Math.abs(SPECIFIC_HEAT_OF_WATER - 4.1855)).toBeLessThan(0.001);
  });
});

describe('computeWaterTemperature', () => {
  // Published worked examples, all in °F; each example's friction factor is n × rise.
  it.each([
    ['A', { ddt: 80, flour: 65, room: 75, rise: 35 / 3, preferments: [] }, 65, 3], // Pizza Today, June 2018, dough temperature example: FF 35 °F, water 65 °F (from memory)
    ['B', { ddt: 75, flour: 65, room: 65, rise: 8 / 3, preferments: [] }, 87, 3], // San Francisco Baking Institute, Artisan I course notes, as quoted on a baker's blog (secondary): FF 8 °F, water 87 °F
    ['C', { ddt: 75, flour: 71, room: 71, rise: 5, preferments: [71] }, 67, 4], // Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf": (75 × 4) − 71 − 71 − 71 − 20 = 67 °F
  ])('gives example %s exactly in °F', (_, inputs, water, factors) => {
    const w = computeWaterTemperature(inputs);
    expect(w.water).toBe(water);
    expect(w.factors).toBe(factors);
  });

  it.each([
    ['A', { ddt: C(80), flour: C(65), room: C(75), rise: dC(35) / 3, preferments: [] }, 18.333333333333332], // example A in °C: (65 − 32)/1.8
    ['B', { ddt: C(75), flour: C(65), room: C(65), rise: dC(8) / 3, preferments: [] }, C(87)], // example B in °C: (87 − 32)/1.8
    ['C', { ddt: C(75), flour: C(71), room: C(71), rise: dC(5), preferments: [C(71)] }, 19.444444444444443], // example C in °C: (67 − 32)/1.8
  ])('gives example %s in °C to 1e-9 when friction converts as a difference', (_, inputs, water) => {
    expect(Math.abs(computeWaterTemperature(inputs).water - water)).toBeLessThan(1e-9);
  });

  it('gets example A wrong when the friction is converted with the 32° offset', () => {
    const wrong = computeWaterTemperature({ ddt: C(80), flour: C(65), room: C(75), rise: C(35) / 3, preferments: [] }).water;
    expect(Math.abs(wrong - C(65))).toBeGreaterThan(1); // the offset must not be applied to a difference
  });

  it('counts one more factor for each pre-ferment, and the friction as n × the same rise', () => {
    // Cook's Illustrated (above): n = 3 for a straight dough, 4 with a starter; each further pre-ferment is one more factor.
    const base = { ddt: 25, room: 22, flour: 20, rise: 4 };
    const three = computeWaterTemperature({ ...base, preferments: [] });
    const four = computeWaterTemperature({ ...base, preferments: [21] });
    const five = computeWaterTemperature({ ...base, preferments: [21, 18] });
    expect([three.factors, four.factors, five.factors]).toEqual([3, 4, 5]);
    expect([three.frictionFactor, four.frictionFactor, five.frictionFactor]).toEqual([12, 16, 20]);
    expect(three.water).toBe(3 * 25 - (22 + 20 + 12)); // 21 °C, by hand
    expect(five.water).toBe(5 * 25 - (22 + 20 + 21 + 18 + 20)); // 24 °C, by hand
  });

  it('brings every dough off the same mixer at the desired temperature: the average of its factors plus the rise', () => {
    // The method's own statement (Cook's Illustrated, above): dough = (Σ factors + friction factor) / n, so the rise over the average is FF/n.
    fc.assert(
      fc.property(fc.double({ min: 18, max: 30, noNaN: true }), fc.double({ min: 0, max: 8, noNaN: true }), fc.array(fc.double({ min: 2, max: 30, noNaN: true }), { maxLength: 3 }), (ddt, rise, preferments) => {
        const w = computeWaterTemperature({ ddt, room: 22, flour: 20, rise, preferments });
        const average = (22 + 20 + w.water + preferments.reduce((a, b) => a + b, 0)) / w.factors;
        expect(Math.abs(average + rise - ddt)).toBeLessThan(1e-9);
      }),
      { numRuns: RUNS },
    );
  });

  it('refuses a temperature that is not a number', () => {
    expect(() => computeWaterTemperature({ ddt: Number.NaN, room: 20, flour: 20, rise: 10, preferments: [] })).toThrow(TemperatureError);
  });
});

describe('computeFriction', () => {
  it('gives back the friction of example A from its water', () => {
    const f = computeFriction({ measured: 80, room: 75, flour: 65, water: 65, preferments: [] });
    expect(f.frictionFactor).toBe(35); // Pizza Today, June 2018: FF = 35 °F (from memory)
    expect(f.straightDoughFactor).toBeCloseTo(35, 12);
    expect(f.rise).toBeCloseTo(35 / 3, 12);
  });

  it('gives back the friction of example C with its starter, and the same mixer on a straight dough', () => {
    const f = computeFriction({ measured: 75, room: 71, flour: 71, water: 67, preferments: [71] });
    expect(f.frictionFactor).toBe(20); // Cook's Illustrated: stand mixer 20 °F in a four-factor sum
    expect(f.rise).toBe(5); // 20 ÷ 4
    expect(f.straightDoughFactor).toBe(15); // 3 × 5: the same mixer's factor on a straight dough
  });

  it('gives 19.44 °C-degrees for example A worked in °C', () => {
    const ff = computeFriction({ measured: C(80), room: C(75), flour: C(65), water: C(65), preferments: [] }).frictionFactor;
    expect(Math.abs(ff - 35 / 1.8)).toBeLessThan(1e-9); // 35 °F-degrees = 19.444 °C-degrees
  });
});

describe('computeIce', () => {
  it('follows the ice formula of a baking textbook, with its rounded L/c', () => {
    // W. Gisslen, "Professional Baking" (Wiley), yeast doughs, water temperature and ice: ice = water × (tap − water)/(tap + 112) in °F,
    // the °C form with + 80 (from memory; page not checked). Our L/c = 333.55/4.186 = 79.68 °C against its 80.
    const textbook = (W: number, tapF: number, wantF: number) => (W * (tapF - wantF)) / (tapF + 112);
    for (const [W, tapF, wantF] of [[20, 70, 50], [40, 65, 42], [12, 75, 55]]) {
      const ours = computeIce(W, C(tapF), C(wantF)).ice;
      expect(Math.abs(ours / textbook(W, tapF, wantF) - 1)).toBeLessThan(0.005);
    }
    expect(textbook(20, 70, 50)).toBeCloseTo(2.1978, 4); // 20 × 20 / 182 (the textbook formula, worked by hand)
    expect(computeIce(20, C(70), C(50)).ice).toBeCloseTo(2.2047, 3); // with L = 333.55, c = 4.186: 0.3 % more than the rounded formula
  });

  it('agrees with a published ice table, cell by cell', () => {
    // Koerner Co., "Ice Temperature Table" (koerner-co.com/pages.php?pID=12): lb of ice per lb of the
    // mix's water, rows = the water temperature wanted (°F), columns = tap water (°F). [wanted, tap, table]
    const cells: [number, number, number][] = [
      [50, 60, 0.057], [50, 70, 0.109], [50, 80, 0.155], [40, 50, 0.061], [40, 60, 0.115], [40, 70, 0.163],
      [40, 80, 0.206], [60, 70, 0.054], [60, 80, 0.103], [70, 80, 0.052], [75, 80, 0.026], [45, 80, 0.181],
    ];
    for (const [wantF, tapF, table] of cells) {
      // within 0.004 lb per lb: the table is printed to 3 decimals and its heat balance rounds L to 144 BTU/lb
      expect(Math.abs(computeIce(1, C(tapF), C(wantF)).ice - table)).toBeLessThan(0.004);
    }
  });

  it('needs the ice of the published constants', () => {
    const share = (tap: number, target: number) => (tap - target) / (tap + 333.55 / 4.186);
    expect(computeIce(1000, 20, 10).ice).toBeCloseTo(1000 * share(20, 10), 9); // 100.32 g
    expect(computeIce(40000, 20, 10).ice).toBeCloseTo(4012.75, 1);
    // With L = 334 and c = 4.18 (a lecture page's rounding) the same water took 100.10 g: 0.2 % too little.
    expect(computeIce(1000, 20, 10, { latentHeat: 334, specificHeat: 4.18 }).ice).toBeCloseTo(100.1, 2);
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
    expect(computeIce(1000, 20, 10).ice).not.toBeCloseTo((1000 * 4.186 * 10) / 333.55, 0); // W·c·ΔT/L = 125.5 g forgets the meltwater
  });

  it('matches the °F shortcut I/W = (T_tap − T_w)/(T_tap + 112) when L/c is 80', () => {
    const k = { latentHeat: 80, specificHeat: 1 };
    expect(computeIce(1, C(80), C(40), k).iceShare).toBeCloseTo(40 / 192, 5); // 80 → 40 °F: (80 − 40)/(80 + 112)
    expect(computeIce(1, C(70), C(50), k).iceShare).toBeCloseTo(20 / 182, 5);
    expect(computeIce(1, C(60), C(40), k).iceShare).toBeCloseTo(20 / 172, 5);
    expect(computeIce(1, C(75), C(32), k).iceShare).toBeCloseTo(43 / 187, 5);
  });

  it('needs no ice when the tap is cold enough, and never a negative amount', () => {
    expect(computeIce(1000, 10, 15)).toEqual({ ice: 0, tapWater: 1000, iceShare: 0 });
    expect(computeIce(1000, 10, 10).ice).toBe(0);
  });

  it('refuses water colder than 0 °C: ice at 0 °C cannot reach it', () => {
    expect(() => computeIce(1000, 15, -2)).toThrow(/below the 0 °C that ice can bring it to/);
  });

  it('can bring water all the way to 0 °C with less ice than water', () => {
    const r = computeIce(1000, 20, 0);
    expect(r.ice).toBeLessThan(1000); // I/W = T_tap/(T_tap + L/c) < 1 at T_w = 0
    expect(r.ice).toBeCloseTo((1000 * 20) / (20 + 333.55 / 4.186), 9);
  });
});

describe('planWater', () => {
  it('works out the water and the ice for the final dough', () => {
    const p = planWater({ ddt: 26, room: 28, flour: 27, rise: 3.25, preferments: [24], tap: 22, waterGrams: 6500 });
    expect(p.waterTemperature).toBe(12); // 4·26 − (28 + 27 + 24 + 4 × 3.25) = 12 °C, by hand
    expect(p.factors).toBe(4);
    expect(p.ice).toBeCloseTo((6500 * 10) / (22 + 333.55 / 4.186), 9);
    expect(p.ice! + p.tapWater!).toBeCloseTo(6500, 9);
    expect(p.warnings.join(' ')).toMatch(/ice/);
  });

  it('gives the share of ice when the water weight is not known', () => {
    const p = planWater({ ddt: 24, room: 24, flour: 24, rise: 4, preferments: [], tap: 20 });
    expect(p.ice).toBeNull();
    expect(p.iceShare).toBeCloseTo(8 / (20 + 333.55 / 4.186), 12);
  });

  it('says when the water must be warmer than the tap', () => {
    const p = planWater({ ddt: 26, room: 20, flour: 18, rise: 10 / 3, preferments: [], tap: 12, waterGrams: 1000 });
    expect(p.ice).toBe(0);
    expect(p.tapWater).toBe(1000);
    expect(p.warnings.join(' ')).toMatch(/warmer than the tap/);
  });

  it('refuses a target that needs water below 0 °C, saying what to change', () => {
    expect(() => planWater({ ddt: 22, room: 30, flour: 30, rise: 13 / 3, preferments: [] })).toThrow(
      'the water would have to be -7.0 °C, below the 0 °C that ice can bring it to; chill the flour or pre-ferment, or lower the friction',
    );
  });

  it('warns about scalding-hot water', () => {
    const p = planWater({ ddt: 24, room: 5, flour: 5, rise: 5 / 3, preferments: [] });
    expect(p.waterTemperature).toBe(57);
    expect(p.warnings.join(' ')).toMatch(/scald/);
  });

  // Common practice: water above about 40 °C is not poured straight onto yeast or a culture;
  // above 50 °C it scalds. Each band gets its own word, and neither below 40 °C.
  it.each([
    [{ ddt: 26, room: 20, flour: 18, rise: 1 / 3 }, 39, null],
    [{ ddt: 26, room: 18, flour: 15, rise: 4 / 3 }, 41, /too warm to pour straight onto yeast or a culture/],
    [{ ddt: 26, room: 12, flour: 12, rise: 4 / 3 }, 50, /too warm to pour straight onto yeast/],
    [{ ddt: 26, room: 12, flour: 11, rise: 4 / 3 }, 51, /scald/],
  ])('gives water of the right warmth its own caution (%j → %i °C)', (inputs, water, caution) => {
    const p = planWater({ ...inputs, preferments: [] });
    expect(p.waterTemperature).toBeCloseTo(water, 9);
    if (caution === null) expect(p.warnings).toEqual([]);
    else expect(p.warnings).toEqual([expect.stringMatching(caution)]);
  });
});

describe('unit invariance of the water temperature method', () => {
  it('gives the same water from °F and °C inputs when friction converts as a difference', () => {
    const t = fc.double({ min: -10, max: 45, noNaN: true });
    fc.assert(
      fc.property(t, t, t, fc.double({ min: 0, max: 30, noNaN: true }), fc.array(t, { maxLength: 3 }), (ddt, room, flour, rise, preferments) => {
        const inC = computeWaterTemperature({ ddt, room, flour, rise, preferments });
        const inF = computeWaterTemperature({
          ddt: celsiusToFahrenheit(ddt),
          room: celsiusToFahrenheit(room),
          flour: celsiusToFahrenheit(flour),
          rise: celsiusDeltaToFahrenheit(rise),
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
        const inC = computeFriction({ measured, room, flour, water, preferments }).rise;
        const inF = computeFriction({
          measured: celsiusToFahrenheit(measured),
          room: celsiusToFahrenheit(room),
          flour: celsiusToFahrenheit(flour),
          water: celsiusToFahrenheit(water),
          preferments: preferments.map(celsiusToFahrenheit),
        }).rise;
        expect(Math.abs(fahrenheitDeltaToCelsius(inF) - inC)).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });
});
