// Reading a batch size has one home (shared/batch.ts). Each row is fed to every surface: the CLI's
// flags (`panform scale`/`cost`), the API's query (`GET /api/formulas/:id?...`) and the viewer's
// address; all read the same target, or all refuse (the CLI with a usage error, the API with 422,
// the viewer by showing the written batch).
import type { Request } from 'express';
import { describe, expect, it } from 'vitest';
import { parseBatch, type BatchFields } from '#shared/batch';
import type { Formula } from '#shared/model';
import type { ScaleTarget } from '#shared/scale';
import { UsageError } from '../../cli/errors.ts';
import { parseTargetFlags } from '../../cli/target-flags.ts';
import { HttpError } from '../../server/http/errors.ts';
import { readScaleTarget } from '../../server/routes/formulas.ts';
import { targetFromSearch } from '../../src/features/formulas/scale-target.ts';

const formula = { id: 'harbour-ciabatta', yield: { pieces: 10, pieceGrams: 320 } } as unknown as Formula;
const written: ScaleTarget = { by: 'pieces', pieces: 10, pieceGrams: 320 };

type Answer = ScaleTarget | 'refused';

function cli(fields: BatchFields): Answer {
  try {
    const t = parseTargetFlags(fields) ?? written;
    return t.by === 'pieces' ? { ...t, pieceGrams: t.pieceGrams ?? formula.yield.pieceGrams } : t;
  } catch (e) {
    if (e instanceof UsageError) return 'refused';
    throw e;
  }
}

function api(fields: BatchFields): Answer {
  try {
    const t = readScaleTarget({ query: fields } as unknown as Request, formula);
    return t.by === 'pieces' ? { ...t, pieceGrams: t.pieceGrams ?? formula.yield.pieceGrams } : t;
  } catch (e) {
    if (e instanceof HttpError && e.status === 422) return 'refused';
    throw e;
  }
}

function viewer(fields: BatchFields): ScaleTarget {
  return targetFromSearch(new URLSearchParams(Object.entries(fields).filter((e): e is [string, string] => e[1] !== undefined)), formula);
}

describe('a batch size, read by every surface', () => {
  // Weights: 1 lb = 453.59237 g exactly (NIST Handbook 44, Appendix C); 1 kg = 1000 g.
  it.each<[BatchFields, Answer]>([
    [{}, written],
    [{ pieces: '60' }, { by: 'pieces', pieces: 60, pieceGrams: 320 }],
    [{ pieces: '18', piece: '900 g' }, { by: 'pieces', pieces: 18, pieceGrams: 900 }],
    [{ pieces: '4', piece: '2 lb' }, { by: 'pieces', pieces: 4, pieceGrams: 907.18474 }],
    [{ mix: '28.47 kg' }, { by: 'mix', grams: 28470 }],
    [{ mix: '25000' }, { by: 'mix', grams: 25000 }],
    [{ flour: '12kg' }, { by: 'flour', grams: 12000 }],
    [{ pieces: '0' }, 'refused'],
    [{ pieces: '2.5' }, 'refused'],
    [{ pieces: '100001' }, 'refused'],
    [{ pieces: 'abc' }, 'refused'],
    [{ piece: '900 g' }, 'refused'],
    [{ pieces: '3', mix: '10 kg' }, 'refused'],
    [{ mix: '10 kg', flour: '5 kg' }, 'refused'],
    [{ mix: '0' }, 'refused'],
    [{ mix: '-5 kg' }, 'refused'],
    [{ mix: '11 t' }, 'refused'],
    [{ mix: '20000000' }, 'refused'],
    [{ pieces: '3', piece: 'heavy' }, 'refused'],
  ])('%j', (fields, answer) => {
    expect(cli(fields)).toEqual(answer);
    expect(api(fields)).toEqual(answer);
    // The viewer shows the written batch for an address it refuses.
    expect(viewer(fields)).toEqual(answer === 'refused' ? written : answer);
  });

  it('words each field as the surface shows it', () => {
    expect(() => parseBatch({ pieces: '3', mix: '1 kg' }, (f) => `--${f}`)).toThrow('--pieces and --mix cannot be used together');
    expect(() => parseBatch({ pieces: '3', mix: '1 kg' })).toThrow('pieces and mix cannot be used together');
  });
});
