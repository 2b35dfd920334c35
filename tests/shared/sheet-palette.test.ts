// Panform's timeline palette reads apart in grey and for colour-blind readers, and every colour a
// chart draws is named in its legend.
import { describe, expect, it } from 'vitest';
import { chartModel, colourOf, legendOf, PALETTE } from '#shared/sheet/chart';
import { buildSheet } from '#shared/sheet/build';
import { STEP_KINDS } from '#shared/schema/vocabulary';
import { FIXTURE_PLANS, sheetInput } from './sheet-fixtures.ts';

type Rgb = [number, number, number];

// sRGB to linear light and the D65 XYZ → CIE L*a*b* conversion: IEC 61966-2-1 (sRGB) and
// CIE 15:2004 "Colorimetry", section 8.2.1.
const linear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
const rgbOf = (hex: string): Rgb => [1, 3, 5].map((i) => linear(parseInt(hex.slice(i, i + 2), 16) / 255)) as Rgb;
const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : (24389 / 27 * t + 16) / 116);
function lab([r, g, b]: Rgb): Rgb {
  const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}
const deltaE = (a: Rgb, b: Rgb) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

// Dichromat simulation matrices in linear RGB, severity 1.0: Machado, Oliveira and Fernandes,
// "A Physiologically-based Model for Simulation of Color Vision Deficiency", IEEE TVCG 15(6),
// 2009, table 1 (values from memory).
const SIMULATIONS: Record<string, number[][]> = {
  protanopia: [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]],
  deuteranopia: [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]],
  tritanopia: [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]],
};
const simulate = (m: number[][], c: Rgb): Rgb => m.map((row) => Math.min(1, Math.max(0, row[0] * c[0] + row[1] * c[1] + row[2] * c[2]))) as Rgb;

const pairs = PALETTE.flatMap((a, i) => PALETTE.slice(i + 1).map((b) => [a, b] as const));

describe('the timeline palette', () => {
  it('has one colour per kind of work, none of them repeated', () => {
    expect(new Set(PALETTE.map((p) => p.colour)).size).toBe(PALETTE.length);
  });

  it('colours every step kind of the formula schema', () => {
    for (const step of [...STEP_KINDS, 'build', 'soak'] as const) expect(PALETTE.map((p) => p.colour)).toContain(colourOf(step));
  });

  // A lightness step of about 8 L* reads as a different grey on paper: common practice.
  it.each(pairs.map(([a, b]) => [a.group, b.group, a.colour, b.colour]))('%s and %s are different greys', (_a, _b, x, y) => {
    expect(Math.abs(lab(rgbOf(x))[0] - lab(rgbOf(y))[0])).toBeGreaterThanOrEqual(8);
  });

  // ΔE*ab of 10 and more is a clearly different colour side by side: common practice.
  it.each(Object.keys(SIMULATIONS))('stays apart under simulated %s', (name) => {
    const m = SIMULATIONS[name];
    // The model keeps white white: each row sums to 1 (from memory, checked here).
    for (const row of m) expect(row[0] + row[1] + row[2]).toBeCloseTo(1, 3);
    for (const [a, b] of pairs) {
      const d = deltaE(lab(simulate(m, rgbOf(a.colour))), lab(simulate(m, rgbOf(b.colour))));
      expect(d, `${a.group} vs ${b.group}`).toBeGreaterThanOrEqual(10);
    }
  });

  it('white is L* 100 and mid grey #777777 about L* 50 (CIE 15:2004 worked values)', () => {
    expect(lab(rgbOf('#ffffff'))[0]).toBeCloseTo(100, 1);
    expect(lab(rgbOf('#777777'))[0]).toBeCloseTo(50.03, 0);
  });

  it('names every colour a chart draws in its legend', () => {
    for (const plan of FIXTURE_PLANS) {
      const model = chartModel(buildSheet(sheetInput(plan)));
      const drawn = new Set(model.rows.flatMap((r) => r.bars.map((b) => colourOf(b.step))));
      expect(new Set(legendOf(model).map((p) => p.colour))).toEqual(drawn);
    }
  });
});
