// The viewer's units follow the CLI's: the same shared functions, the same exact definitions.
import { describe, expect, it } from 'vitest';
import { unitsFor } from '../../../src/lib/units.ts';
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
