// Units as bakers write them, and display rounding.
import { describe, expect, it } from 'vitest';
import {
  convertMass, DEFAULT_RESOLUTION, fahrenheitDeltaToCelsius, formatGrams, formatMass, GRAMS_PER_OUNCE, GRAMS_PER_POUND, parseMass,
  parseMassArgument, parseResolution, parseTemperature, parseTemperatureArgument, parseTemperatureDelta, parseTemperatureDeltaArgument,
  QuantityError, roundDegrees, roundGrams, roundMassIn, toGrams,
} from '#shared/units';

describe('exact weights', () => {
  it('defines the pound and the ounce exactly', () => {
    expect(GRAMS_PER_POUND).toBe(453.59237); // International yard and pound agreement (1959)
    expect(GRAMS_PER_OUNCE).toBe(28.349523125); // 453.592 37 / 16 (1 lb = 16 oz avoirdupois)
    expect(toGrams(16, 'oz')).toBe(GRAMS_PER_POUND); // 1 lb = 16 oz avoirdupois
    expect(convertMass(7000, 'g', 'g')).toBe(7000);
  });
});

describe('parseMass', () => {
  it.each([
    ['320 g', 320],
    ['0.32 kg', 320],
    ['2 lb', 2 * 453.59237], // International yard and pound agreement (1959)
    ['11 oz', 11 * 28.349523125], // same, 1 oz = 1/16 lb
    ['28.47kg', 28470],
    ['900G', 900],
  ])('reads %s', (text, grams) => {
    expect(parseMass(text)).toBeCloseTo(grams, 9);
  });

  it('refuses a bare number in a file', () => {
    expect(() => parseMass('320')).toThrow(QuantityError);
  });
});

describe('parseMassArgument', () => {
  it.each([
    ['900 g', 900],
    ['28.47 kg', 28470],
    ['2 lb', 907.18474],
    ['900', 900],
  ])('reads %s from the command line', (text, grams) => {
    expect(parseMassArgument(text)).toBeCloseTo(grams, 9);
  });

  it('refuses a word', () => {
    expect(() => parseMassArgument('heavy')).toThrow(/not a weight/);
  });
});

describe('temperatures', () => {
  it('reads a temperature with its unit', () => {
    expect(parseTemperature('25 °C')).toBe(25);
    expect(parseTemperature('77°F')).toBeCloseTo(25, 12); // (77 − 32)/1.8
  });

  it('converts a temperature difference without the offset', () => {
    expect(fahrenheitDeltaToCelsius(20)).toBeCloseTo(11.11, 2); // a difference: 20 × 5/9 = 11.11 °C-degrees, not −6.67 °C (t/°F = 1.8·t/°C + 32, NIST SP 811 App. B.9)
    expect(parseTemperatureDelta('20 °F')).toBeCloseTo(100 / 9, 12);
    expect(parseTemperatureDeltaArgument('20', 'F')).toBeCloseTo(100 / 9, 12);
    expect(parseTemperatureDeltaArgument('13')).toBe(13);
  });

  it('reads bare command-line numbers in the default unit', () => {
    expect(parseTemperatureArgument('25')).toBe(25);
    expect(parseTemperatureArgument('77', 'F')).toBeCloseTo(25, 12);
    expect(parseTemperatureArgument('77F')).toBeCloseTo(25, 12);
    expect(parseTemperatureArgument('-5')).toBe(-5);
  });
});

describe('roundGrams', () => {
  it.each([
    [1234.5, 1235], // 1 g at or above 100 g (docs/arithmetic.md, "Rounding for display")
    [1234.49, 1234],
    [99.96, 100], // the fine step applies below 100 g
    [56.34, 56.3], // 0.1 g below 100 g
    [0.19, 0.2],
    [100.4, 100],
  ])('rounds %d g to %d g for display', (grams, shown) => {
    expect(roundGrams(grams)).toBe(shown);
  });

  it('follows a configured resolution', () => {
    const r = parseResolution('5,1,500');
    expect(r).toEqual({ coarse: 5, fine: 1, fineBelow: 500 });
    expect(roundGrams(1233, r)).toBe(1235);
    expect(roundGrams(233.4, r)).toBe(233);
  });

  it('fills in the rest of a short resolution from the default', () => {
    expect(parseResolution('1')).toEqual(DEFAULT_RESOLUTION);
    expect(parseResolution('2,0.5')).toEqual({ coarse: 2, fine: 0.5, fineBelow: 100 });
  });

  it.each(['', '0', '-1', 'one', '1,2,3,4', '1,,100'])('refuses the resolution %j', (text) => {
    expect(() => parseResolution(text)).toThrow(QuantityError);
  });
});

describe('roundMassIn', () => {
  it.each([
    [907.18474, 'g', 907], // NIST SP 811 App. B.8: 2 lb = 907.184 74 g; 1 g steps at or above 100 g
    [28.349523125, 'g', 28.3], // NIST SP 811 App. B.8: 1 oz; 0.1 g steps below 100 g
    [2.20462262, 'lb', 2.205], // NIST SP 811 App. B.8: 1 kg = 2.204 622 6 lb
    [35.27396195, 'oz', 35.27], // NIST SP 811 App. B.8: 1 kg = 35.273 96 oz
    [0.35273962, 'oz', 0.353], // 10 g in oz: three decimals under 1 oz
    [0.45359237, 'kg', 0.454], // NIST SP 811 App. B.8: 1 lb = 0.453 592 37 kg
  ] as const)('shows %d %s as %d', (value, unit, shown) => {
    expect(roundMassIn(value, unit)).toBe(shown);
  });
});

describe('roundDegrees', () => {
  it('keeps a tenth of a degree', () => {
    expect(roundDegrees((78 - 32) / 1.8)).toBe(25.6); // NIST SP 811 App. B.8: 78 °F = 25.555… °C
    expect(roundDegrees(-40)).toBe(-40); // NIST SP 811 App. B.8: the scales meet at −40
  });
});

describe('formatting', () => {
  it('groups thousands and keeps one decimal below 100 g', () => {
    expect(formatGrams(28470)).toBe('28\u202f470 g');
    expect(formatGrams(56.34)).toBe('56.3 g');
  });

  it('prints pounds and ounces, carrying 16 oz into a pound', () => {
    expect(formatMass(453.59237 * 2 + 28.349523125 * 3.2, 'us')).toBe('2 lb 3.20 oz');
    expect(formatMass(453.59237 - 0.001, 'us')).toBe('1 lb 0.00 oz');
    expect(formatMass(10, 'us')).toBe('0.353 oz');
    expect(formatMass(1000, 'metric')).toBe('1\u202f000 g');
  });
});
