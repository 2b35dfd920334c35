// Trays, tins, pots, bannetons and couches the night needs at its busiest moment, from each mix's
// steps on the timeline, against what the plan says the bakery has.
//
// Rules (docs/batch-sheet.md, "Equipment"):
// - Each bake load (a bake entry: slots on one deck) holds slots × per_slot pieces, the last load
//   the pieces left over.
// - Pots and tins hold one piece each; a tray or a couche holds one oven slot's load (per_slot
//   pieces), so a load takes as many as it fills slots.
// - What the pieces rise in (the `vessel` of the proof or retard step) is taken from the start of
//   shaping (else of that step) and given back when the load goes into the oven; if they bake in
//   the same tins or trays, when the load comes out. A bake vessel alone (pots, tins, trays) is
//   held from loading to unloading.
// - The count needed is the most in use at one moment (a sweep over those holds; one given back
//   at a minute can be taken again at that minute), not the night's total.
// Pure; no I/O.
import type { Formula } from '../model.ts';
import type { EquipmentKind } from '../schema/shapes.ts';
import { EQUIPMENT_KINDS } from '../schema/vocabulary.ts';
import type { EquipmentNeed, LocalDateTime, SheetMix, TimelineEntry } from './types.ts';

interface Hold {
  kind: EquipmentKind;
  count: number;
  from: number;
  until: number;
  use: EquipmentNeed['uses'][number];
}

const isKit = (v: string | undefined): v is EquipmentKind => v !== undefined && (EQUIPMENT_KINDS as readonly string[]).includes(v);

/** How many of `kind` one load of `pieces` takes. */
function countFor(kind: EquipmentKind, pieces: number, perSlot: number, slots: number): number {
  if (kind === 'tray' || kind === 'couche') return Math.min(slots, Math.ceil(pieces / perSlot - 1e-9));
  return pieces;
}

export function equipmentNeeds(
  mixes: SheetMix[],
  timeline: TimelineEntry[],
  formulas: Record<string, Formula>,
  have: Partial<Record<EquipmentKind, number>> | undefined,
  at: (minute: number) => LocalDateTime,
): { needs: EquipmentNeed[]; warnings: string[] } {
  const holds: Hold[] = [];
  const byMix = new Map<string, TimelineEntry[]>();
  for (const e of timeline) {
    if (e.window || e.order === null || e.mixNumber === null) continue;
    const key = `${e.order}:${e.mixNumber}`;
    const list = byMix.get(key) ?? [];
    list.push(e);
    byMix.set(key, list);
  }
  for (const m of mixes) {
    const entries = byMix.get(`${m.order}:${m.mixNumber}`) ?? [];
    const bakes = entries.filter((e) => e.step === 'bake').sort((a, b) => a.startMinute - b.startMinute);
    if (bakes.length === 0) continue;
    const f = formulas[m.formula];
    const perSlot = f?.process.find((s) => s.step === 'bake')?.perSlot ?? 1;
    const proof = entries.find((e) => (e.step === 'proof' || e.step === 'retard') && isKit(e.vessel));
    const proofKind = proof && isKit(proof.vessel) ? proof.vessel : null;
    const shape = entries.find((e) => e.step === 'shape');
    const takenAt = shape ? shape.startMinute : (proof?.startMinute ?? 0);
    const label = `${m.title} ${m.mixNumber}/${m.of}`;
    let left = m.pieces;
    bakes.forEach((b, i) => {
      const slots = b.slots ?? 1;
      const pieces = i === bakes.length - 1 ? left : Math.min(left, Math.round(slots * perSlot));
      left -= pieces;
      if (pieces <= 0) return;
      const bakeKind = isKit(b.vessel) ? b.vessel : null;
      const hold = (kind: EquipmentKind, from: number, until: number, step: 'proof' | 'bake') =>
        holds.push({ kind, count: countFor(kind, pieces, perSlot, slots), from, until, use: { formula: m.formula, label, step, count: 0, from: at(from), until: at(until) } });
      if (proofKind) hold(proofKind, takenAt, proofKind === bakeKind ? b.endMinute : b.startMinute, 'proof');
      if (bakeKind && bakeKind !== proofKind) hold(bakeKind, b.startMinute, b.endMinute, 'bake');
    });
  }

  const needs: EquipmentNeed[] = [];
  const warnings: string[] = [];
  for (const kind of EQUIPMENT_KINDS) {
    const mine = holds.filter((h) => h.kind === kind);
    if (mine.length === 0) continue;
    // Sweep: at equal minutes, give back before taking.
    const events = mine.flatMap((h) => [{ t: h.from, d: h.count }, { t: h.until, d: -h.count }]).sort((a, b) => a.t - b.t || a.d - b.d);
    let now = 0;
    let peak = 0;
    let peakAt = events[0].t;
    for (const ev of events) {
      now += ev.d;
      if (now > peak) {
        peak = now;
        peakAt = ev.t;
      }
    }
    const uses = new Map<string, EquipmentNeed['uses'][number]>();
    for (const h of mine) {
      const key = `${h.use.label}:${h.use.step}`;
      const u = uses.get(key);
      if (!u) uses.set(key, { ...h.use, count: h.count });
      else {
        u.count += h.count;
        if (h.use.until > u.until) u.until = h.use.until;
      }
    }
    const count = have?.[kind];
    const short = count === undefined ? 0 : Math.max(0, peak - count);
    needs.push({ kind, peak, at: at(peakAt), have: count ?? null, short, uses: [...uses.values()] });
    if (short > 0) {
      warnings.push(`short of ${kind}s: the night needs ${peak} at once (at ${at(peakAt).slice(11)}), the plan's equipment lists ${count}; find ${short} more, or bake in more loads`);
    } else if (have && count === undefined) {
      warnings.push(`the plan's equipment does not count ${kind}s; the night needs ${peak} at once (at ${at(peakAt).slice(11)})`);
    }
  }
  return { needs, warnings };
}
