import { useEffect, useState } from 'react';
import type { Formula } from '#shared/model';
import type { ScaleTarget } from '#shared/scale';
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
  const { pieceWeight } = useUnits();
  const mode: Mode = target.by === 'mix' ? 'mix' : 'pieces';
  const piecesNow = target.by === 'pieces' ? target.pieces : formula.yield.pieces;
  const pieceNow = target.by === 'pieces' ? (target.pieceGrams ?? formula.yield.pieceGrams) : formula.yield.pieceGrams;
  const mixNow = target.by === 'mix' ? target.grams : null;

  const [pieces, setPieces] = useState(String(piecesNow));
  const [piece, setPiece] = useState(trim(pieceNow));
  const [mixKg, setMixKg] = useState(mixNow === null ? '' : trim(mixNow / 1000));

  // Follow the URL when it changes from outside (back button, reset).
  useEffect(() => setPieces(String(piecesNow)), [piecesNow]);
  useEffect(() => setPiece(trim(pieceNow)), [pieceNow]);
  useEffect(() => {
    if (mixNow !== null) setMixKg(trim(mixNow / 1000));
  }, [mixNow]);

  const piecesValue = readNumber(pieces);
  const pieceValue = readNumber(piece);
  const mixValue = readNumber(mixKg);
  const piecesError = piecesValue === null || !Number.isInteger(piecesValue) || piecesValue < 1 ? 'A whole number, 1 or more.' : undefined;
  const pieceError = pieceValue === null || pieceValue <= 0 ? 'A weight above 0 g.' : undefined;
  const mixError = mixValue === null || mixValue <= 0 ? 'A weight above 0 kg.' : undefined;

  const setMode = (m: Mode) => {
    if (m === mode) return;
    if (m === 'pieces') onChange({ by: 'pieces', pieces: piecesValue && !piecesError ? piecesValue : formula.yield.pieces, pieceGrams: pieceValue && !pieceError ? pieceValue : formula.yield.pieceGrams });
    else {
      const kg = Math.round(mixedDough / 100) / 10;
      setMixKg(trim(kg));
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
            inputMode="decimal"
            suffix="g"
            value={piece}
            error={pieceError}
            onChange={(e) => {
              setPiece(e.target.value);
              const n = readNumber(e.target.value);
              if (n !== null && n > 0) onChange({ by: 'pieces', pieces: piecesValue && !piecesError ? piecesValue : piecesNow, pieceGrams: n });
            }}
          />
        </div>
      ) : (
        <TextField
          label="Mixed dough"
          name="mix"
          inputMode="decimal"
          suffix="kg"
          value={mixKg}
          error={mixError}
          hint="The whole dough out of the mixer; no loss allowance is added."
          onChange={(e) => {
            setMixKg(e.target.value);
            const n = readNumber(e.target.value);
            if (n !== null && n > 0) onChange({ by: 'mix', grams: n * 1000 });
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

function trim(n: number): string {
  return String(Number(n.toFixed(3)));
}
