// The checks a load runs beyond each file's schema: cross-file references. The trade checks of
// shared/check join here when they land.
import type { Finding } from '#shared/parse';
import type { ExtraCheck } from './check.ts';
import { parseYamlText } from '#shared/parse';

/** A plan's orders must name formulas in the same load. */
export const tradeChecks: ExtraCheck = ({ formulas, plans }) => {
  const findings: Finding[] = [];
  if (formulas.length === 0) return findings;
  const ids = new Set(formulas.map((f) => f.value.id));
  for (const p of plans) {
    const y = parseYamlText(p.file.text, p.file.path);
    p.value.orders.forEach((o, i) => {
      if (ids.has(o.formula)) return;
      const where = y.ok ? y.source.locate(`/orders/${i}/formula`) : { line: 1, col: 1 };
      findings.push({ file: p.file.path, ...where, severity: 'error', pointer: `/orders/${i}/formula`, message: `order ${i + 1} names the formula "${o.formula}", which is not in this load` });
    });
  }
  return findings;
};
