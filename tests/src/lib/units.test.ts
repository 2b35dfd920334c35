// The viewer's units follow the CLI's: the same shared functions, the same exact definitions.
import { describe, expect, it } from 'vitest';
import { temperatureInput, unitsFor } from '../../../src/lib/units.ts';
import { weight as cliWeight, temperature as cliTemperature } from '../../../cli/print/format.ts';
import { DEFAULT_RESOLUTION } from '#shared/units';

describe('unitsFor', () => {
  const us = unitsFor('us');
  it.each([
    [453.59237, '1 lb 0.00 oz'], // NIST SP 811 App. B.8: 1 lb = 453.592 37 g exactly
    [28.349523125, '1.00 oz'], // NIST SP 811 App. B.8: 1 oz = 28.349 523 125 g exactly
    [10, '0.353 oz'], // 10 g / 28.349 523 125 g; three decimals under 1 oz
    [11020, '24 lb 4.72 oz'], // 11 020 g / 453.592 37 = 24.295 lb
  ])('shows %d g as %s, as `panform scale --units us` prints it', (grams, text) => {
    expect(us.grams(grams)).toBe(text);
    expect(us.weight(grams)).toBe(cliWeight(grams, { system: 'us', resolution: DEFAULT_RESOLUTION, temperature: 'F' }));
  });

  it('shows temperatures in °F and a friction rise by ×1.8 without the offset', () => {
    expect(us.temperature(25)).toBe('77.0 °F'); // NIST SP 811 App. B.8: t/°F = 1.8·t/°C + 32
    expect(us.temperature(25)).toBe(cliTemperature(25, { system: 'us', resolution: DEFAULT_RESOLUTION, temperature: 'F' }));
    expect(us.temperature(230, 0)).toBe('446 °F'); // NIST SP 811 App. B.8
    expect(us.degrees(13)).toBe('23.4 °F'); // NIST SP 811 App. B.8: a difference converts by 1.8 alone
  });

  it('keeps grams and °C for metric', () => {
    const metric = unitsFor('metric');
    expect(metric.grams(56.34)).toBe('56.3 g');
    expect(metric.temperature(25, 0)).toBe('25 °C');
    expect(metric.degrees(13)).toBe('13 °C');
  });
});

describe('temperatureInput (the record form)', () => {
  it('reads °F typed in US customary and keeps °C', () => {
    const f = temperatureInput('F');
    expect(f.unit).toBe('F');
    expect(f.fromTyped(32)).toBe(0); // NIST SP 811 App. B.8: t/°C = (t/°F − 32)/1.8
    expect(f.fromTyped(78.8)).toBe(26); // (78.8 − 32)/1.8 = 26
    expect(f.fromTyped(77.5)).toBe(25.28); // 25.277… kept to 0.01 °C
    expect(f.toTyped(26)).toBe(78.8); // back as it was typed
    expect(f.toTyped(f.fromTyped(77.5))).toBe(77.5);
    expect(f.toTyped(null)).toBeNull();
    expect(f.range(0, 60)).toBe('32 to 140 °F'); // NIST SP 811 App. B.8
  });

  it('takes °C as typed in metric', () => {
    const c = temperatureInput('C');
    expect(c.unit).toBe('C');
    expect(c.fromTyped(25.5)).toBe(25.5);
    expect(c.toTyped(25.5)).toBe(25.5);
    expect(c.range(0, 100)).toBe('0 to 100 °C');
  });
});
