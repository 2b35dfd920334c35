// The water helper's readings follow the person's units: kept as typed, converted once when the
// units change (a temperature by t/°F = 1.8·t/°C + 32, a mixer's rise by 1.8 alone; NIST SP 811
// App. B.8), and worked out in °C.
import { describe, expect, it } from 'vitest';
import { readingsIn, type Readings } from '../../../../src/features/formulas/components/water-temperature.tsx';

const metric: Readings = { date: '2026-12-03', mixer: 'spiral', room: '22', flour: '20', tap: '12', rise: '4.33', preferments: { levain: '21', biga: '' } };

describe('readingsIn', () => {
  it('converts readings kept in °C to °F once, the rise as a difference', () => {
    const us = readingsIn(metric, 'F');
    expect(us).toEqual({ ...metric, unit: 'F', room: '71.6', flour: '68', tap: '53.6', rise: '7.79', preferments: { levain: '69.8', biga: '' } });
    // Readings kept before there was a unit are °C.
    expect(readingsIn(metric, 'C')).toBe(metric);
  });

  it('comes back to the same °C figures', () => {
    const back = readingsIn(readingsIn(metric, 'F'), 'C');
    expect(back).toEqual({ ...metric, unit: 'C' });
  });

  it('leaves text that is not a number as it was typed', () => {
    expect(readingsIn({ ...metric, room: 'warm' }, 'F').room).toBe('warm');
  });
});
