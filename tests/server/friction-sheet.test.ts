// The friction proposal on the printed sheet: the section the layout takes from presentSheet, in
// the HTML page and in the PDF (read back with poppler's pdftotext), naming the line to change.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { proposeFriction } from '#shared/friction';
import { buildSheet } from '#shared/sheet/build';
import { renderSheetHtml } from '#shared/sheet/html';
import { layoutSheet } from '#shared/sheet/layout';
import { renderSheetPdf } from '../../server/print/pdf.ts';
import { DEMO_PLANS, sheetInput } from '../shared/sheet-fixtures.ts';

const plain = buildSheet(sheetInput(DEMO_PLANS[0]));
const proposal = proposeFriction(
  { mixer: 'spiral', formula: 'harbour-ciabatta', title: 'Harbour ciabatta' },
  [5, 5.5, 4.5, 5, 9.5, 5].map((rise, i) => ({ recordId: i + 1, date: `2026-11-${12 + 3 * i}`, rise })),
  { rise: 13 / 3, riseFrom: 'friction', plan: '2026-12-03', path: 'formulas/plans/2026-12-03.yaml' },
);
const sheet = { ...plain, frictionProposals: [proposal] };

describe('the friction proposal on the sheet', () => {
  it('is a section of the layout, after the products and before the cautions', () => {
    const keys = layoutSheet(sheet).items.map((i) => i.key);
    expect(keys.indexOf('friction')).toBe(keys.indexOf('formulas') + 1);
    expect(layoutSheet(plain).items.map((i) => i.key)).not.toContain('friction');
  });

  it('names the basis and the line to change in the HTML page', () => {
    const html = renderSheetHtml(sheet);
    expect(html).toContain('Friction from the bench records');
    expect(html).toContain('spiral · Harbour ciabatta');
    expect(html).toContain('median from 6 mixes, 12–27 Nov (1 left out as an outlier)');
    expect(html).toContain('to use it: in formulas/plans/2026-12-03.yaml, mixer spiral: friction: 13 °C becomes friction: 15 °C; until then the sheet keeps the plan&#39;s value');
  });

  it('prints it in the PDF', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'panform-friction-pdf-'));
    try {
      const pdf = join(dir, 'sheet.pdf');
      writeFileSync(pdf, await renderSheetPdf(sheet));
      const text = execFileSync('/usr/bin/pdftotext', ['-raw', pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
      expect(text).toContain('Friction from the bench records');
      expect(text).toContain('mixer spiral: friction: 13 °C becomes friction: 15 °C');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);
});
