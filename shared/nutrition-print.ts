// The nutrition declaration as a plain-text table and as an HTML table, for the CLI and the
// printed label. The viewer draws the same lines (NutritionDeclaration.lines). Pure; no I/O.
import type { NutritionDeclaration } from './nutrition.ts';

const escapeHtml = (t: string) =>
  t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

/** Column headings: EU per 100 g and per piece; US per serving and % Daily Value. */
export function nutritionHeadings(d: NutritionDeclaration): [string, string, string] {
  return d.rules === 'eu'
    ? ['Nutrition declaration', 'per 100 g', `per piece (${Math.round(d.piece.bakedGrams)} g)`]
    : ['Nutrition Facts', `per serving: ${d.serving?.text ?? ''}`, '% Daily Value*'];
}

export function nutritionText(d: NutritionDeclaration): string {
  const [title, a, b] = nutritionHeadings(d);
  const rows = d.lines.map((l) => [
    `${l.sub ? '  ' : ''}${l.label}`,
    l.value,
    d.rules === 'eu' ? (l.perPiece ?? '') : l.dailyValue === undefined ? '' : `${l.dailyValue} %`,
  ]);
  const w0 = Math.max(title.length, ...rows.map((r) => r[0].length));
  const w1 = Math.max(a.length, ...rows.map((r) => r[1].length));
  const line = (r: string[]) => `${r[0].padEnd(w0)}  ${r[1].padStart(w1)}  ${r[2]}`.trimEnd();
  const out = [line([title, a, b]), ...rows.map(line)];
  if (d.rules === 'us') out.push('* The % Daily Value tells how much a nutrient in a serving contributes to a daily diet; 2,000 calories a day is used for general nutrition advice.');
  return `${out.join('\n')}\n`;
}

export function nutritionHtml(d: NutritionDeclaration): string {
  const [title, a, b] = nutritionHeadings(d);
  const rows = d.lines
    .map((l) => {
      const third = d.rules === 'eu' ? (l.perPiece ?? '') : l.dailyValue === undefined ? '' : `${l.dailyValue}%`;
      return `<tr${l.sub ? ' class="sub"' : ''}><th scope="row">${escapeHtml(l.label)}</th><td>${escapeHtml(l.value)}</td><td>${escapeHtml(third)}</td></tr>`;
    })
    .join('\n');
  return `<table class="nutrition" data-rules="${d.rules}">\n<caption>${escapeHtml(title)}</caption>\n<thead><tr><th scope="col"></th><th scope="col">${escapeHtml(a)}</th><th scope="col">${escapeHtml(b)}</th></tr></thead>\n<tbody>\n${rows}\n</tbody>\n</table>\n<p class="caution">${escapeHtml(d.caution)}</p>\n`;
}
