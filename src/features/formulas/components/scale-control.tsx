import { useEffect, useState } from 'react';
import type { Formula } from '#shared/model';
import type { ScaleTarget } from '#shared/scale';
import { BatchError, parseBatch } from '#shared/batch';
import { fromGrams } from '#shared/units';
import { readNumber, TextField } from '../../../components/field.tsx';
import { Segmented } from '../../../components/segmented.tsx';
import { useUnits } from '../../../lib/units.ts';
import { isWrittenBatch, writtenBatch } from '../scale-target.ts';

type Mode = 'pieces' | 'mix';
const MODES = [
  ['pieces', 'Pieces × weight'],
  ['mix', 'Dough weight'],
] as const;

/**
 * How big a batch: pieces × piece weight, or a weight of mixed dough. Every valid keystroke
 * becomes the new target at once; a half-typed number waits.
 */
export function ScaleControl({
  formula,
  target,
  mixedDough,
  onChange,
}: {
  formula: Formula;
  target: ScaleTarget;
  /** The mixed dough of the batch shown now (shared/scale.ts), where a switch to dough weight starts. */
  mixedDough: number;
  onChange: (t: ScaleTarget) => void;
}) {
  const { pieceWeight, weight, system } = useUnits();
  // Weights are typed with their unit ("25 kg", "320 g", "2 lb"); a bare number is grams, as on
  // the command line (shared/batch.ts reads both), and the hint says how the text was read.
  const pieceText = (g: number) => (system === 'us' ? `${trim(fromGrams(g, 'oz'))} oz` : `${trim(g)} g`);
  const mixText = (g: number) => (system === 'us' ? `${trim(fromGrams(g, 'lb'))} lb` : `${trim(g / 1000)} kg`);
  const mode: Mode = target.by === 'mix' ? 'mix' : 'pieces';
  const piecesNow = target.by === 'pieces' ? target.pieces : formula.yield.pieces;
  const pieceNow = target.by === 'pieces' ? (target.pieceGrams ?? formula.yield.pieceGrams) : formula.yield.pieceGrams;
  const mixNow = target.by === 'mix' ? target.grams : null;

  const [pieces, setPieces] = useState(String(piecesNow));
  const [piece, setPiece] = useState(pieceText(pieceNow));
  const [mixKg, setMixKg] = useState(mixNow === null ? '' : mixText(mixNow));

  // Follow the URL when it changes from outside (back button, reset).
  useEffect(() => setPieces(String(piecesNow)), [piecesNow]);
  useEffect(() => setPiece((typed) => (readWeight('piece', typed).grams === pieceNow ? typed : pieceText(pieceNow))), [pieceNow, system]);
  useEffect(() => {
    if (mixNow !== null) setMixKg((typed) => (readWeight('mix', typed).grams === mixNow ? typed : mixText(mixNow)));
  }, [mixNow, system]);

  const piecesValue = readNumber(pieces);
  const pieceRead = readWeight('piece', piece);
  const mixRead = readWeight('mix', mixKg);
  const pieceValue = pieceRead.grams;
  const mixValue = mixRead.grams;
  const piecesError = piecesValue === null || !Number.isInteger(piecesValue) || piecesValue < 1 ? 'A whole number, 1 or more.' : undefined;
  const pieceError = pieceRead.error;
  const mixError = mixRead.error;

  const setMode = (m: Mode) => {
    if (m === mode) return;
    if (m === 'pieces') onChange({ by: 'pieces', pieces: piecesValue && !piecesError ? piecesValue : formula.yield.pieces, pieceGrams: pieceValue && !pieceError ? pieceValue : formula.yield.pieceGrams });
    else {
      const kg = Math.round(mixedDough / 100) / 10;
      setMixKg(mixText(kg * 1000));
      onChange({ by: 'mix', grams: kg * 1000 });
    }
  };

  const step = (delta: number) => {
    const next = Math.max(1, (piecesValue && !piecesError ? piecesValue : piecesNow) + delta);
    setPieces(String(next));
    onChange({ by: 'pieces', pieces: next, pieceGrams: pieceValue && !pieceError ? pieceValue : pieceNow });
  };

  return (
    <fieldset className="m-0 min-w-0 space-y-3 border-0 p-0 print:hidden" data-testid="scale-control">
      <Segmented<Mode> label="Scale by" options={MODES} value={mode} onChange={setMode} optionClassName="flex-1" />
      {mode === 'pieces' ? (
        <div className="grid grid-cols-[1fr_1fr] gap-3">
          <div>
            <TextField
              label="Pieces"
              name="pieces"
              inputMode="numeric"
              value={pieces}
              error={piecesError}
              onChange={(e) => {
                setPieces(e.target.value);
                const n = readNumber(e.target.value);
                if (n !== null && Number.isInteger(n) && n >= 1) onChange({ by: 'pieces', pieces: n, pieceGrams: pieceValue && !pieceError ? pieceValue : pieceNow });
              }}
            />
            <div className="mt-2 flex gap-2">
              <button type="button" aria-label="One piece fewer" onClick={() => step(-1)} className="min-h-12 flex-1 rounded-xl border-2 border-line bg-card text-2xl font-bold hover:border-crust">
                −
              </button>
              <button type="button" aria-label="One piece more" onClick={() => step(1)} className="min-h-12 flex-1 rounded-xl border-2 border-line bg-card text-2xl font-bold hover:border-crust">
                +
              </button>
            </div>
          </div>
          <TextField
            label="Piece weight"
            name="piece"
            value={piece}
            error={pieceError}
            hint={pieceValue !== null ? `read as ${pieceWeight(pieceValue)}` : undefined}
            onChange={(e) => {
              setPiece(e.target.value);
              const n = readWeight('piece', e.target.value).grams;
              if (n !== null) onChange({ by: 'pieces', pieces: piecesValue && !piecesError ? piecesValue : piecesNow, pieceGrams: n });
            }}
          />
        </div>
      ) : (
        <TextField
          label="Mixed dough"
          name="mix"
          value={mixKg}
          error={mixError}
          hint={`${mixValue !== null ? `Read as ${weight(mixValue)}. ` : ''}The whole dough out of the mixer, e.g. "25 kg" or "25000 g"; no loss allowance is added.`}
          onChange={(e) => {
            setMixKg(e.target.value);
            const n = readWeight('mix', e.target.value).grams;
            if (n !== null) onChange({ by: 'mix', grams: n });
          }}
        />
      )}
      {!isWrittenBatch(target, formula) && (
        <button
          type="button"
          onClick={() => onChange(writtenBatch(formula))}
          className="min-h-12 w-full rounded-xl border-2 border-dashed border-line px-3 text-crust hover:border-crust"
        >
          Back to the written batch ({formula.yield.pieces} × {pieceWeight(formula.yield.pieceGrams)})
        </button>
      )}
    </fieldset>
  );
}

/** A typed weight through the one batch reader (shared/batch.ts): its grams, or why not. */
function readWeight(field: 'piece' | 'mix', text: string): { grams: number | null; error?: string } {
  try {
    const t = parseBatch(field === 'mix' ? { mix: text } : { pieces: '1', piece: text }, () => (field === 'mix' ? 'the dough weight' : 'the piece weight'));
    const grams = t?.by === 'mix' ? t.grams : t?.by === 'pieces' ? (t.pieceGrams ?? null) : null;
    return grams === null ? { grams: null, error: 'A weight, e.g. "25 kg", "320 g" or "2 lb".' } : { grams };
  } catch (e) {
    if (e instanceof BatchError) return { grams: null, error: `${e.message[0].toUpperCase()}${e.message.slice(1)}${e.hint ? ` (${e.hint})` : ''}.` };
    throw e;
  }
}

function trim(n: number): string {
  return String(Number(n.toFixed(3)));
}
