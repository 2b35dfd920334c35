import { describe, expect, it } from 'vitest';
import type { Formula } from '#shared/model';
import { isWrittenBatch, searchFromTarget, targetFromSearch } from '../../../../src/features/formulas/scale-target.ts';

const formula = {
  id: 'harbour-ciabatta',
  yield: { pieces: 10, pieceGrams: 320 },
} as unknown as Formula;

describe('targetFromSearch', () => {
  it.each([
    ['', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
    ['pieces=60', { by: 'pieces', pieces: 60, pieceGrams: 320 }],
    ['pieces=60&piece=500', { by: 'pieces', pieces: 60, pieceGrams: 500 }],
    ['piece=500', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
    ['mix=25000', { by: 'mix', grams: 25000 }],
    ['mix=25000&pieces=60', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
    ['mix=28.47kg', { by: 'mix', grams: 28470 }],
    ['pieces=abc', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
    ['pieces=-4', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
    ['mix=0', { by: 'pieces', pieces: 10, pieceGrams: 320 }],
  ])('reads "%s" as the batch to scale to', (search, expected) => {
    expect(targetFromSearch(new URLSearchParams(search), formula)).toEqual(expected);
  });
});

describe('searchFromTarget', () => {
  it.each([
    [{ by: 'pieces', pieces: 10, pieceGrams: 320 }, {}],
    [{ by: 'pieces', pieces: 60, pieceGrams: 320 }, { pieces: '60' }],
    [{ by: 'pieces', pieces: 60, pieceGrams: 500 }, { pieces: '60', piece: '500' }],
    [{ by: 'mix', grams: 25000 }, { mix: '25000' }],
  ] as const)('writes %o into the URL as %o', (target, expected) => {
    expect(searchFromTarget(target, formula)).toEqual(expected);
  });

  it('round-trips through the URL', () => {
    const target = { by: 'pieces', pieces: 33, pieceGrams: 275 } as const;
    expect(targetFromSearch(new URLSearchParams(searchFromTarget(target, formula)), formula)).toEqual(target);
  });
});

describe('isWrittenBatch', () => {
  it('knows the batch the formula is written for, with or without the piece weight spelled out', () => {
    expect(isWrittenBatch({ by: 'pieces', pieces: 10 }, formula)).toBe(true);
    expect(isWrittenBatch({ by: 'pieces', pieces: 10, pieceGrams: 320 }, formula)).toBe(true);
    expect(isWrittenBatch({ by: 'pieces', pieces: 11 }, formula)).toBe(false);
    expect(isWrittenBatch({ by: 'mix', grams: 3265 }, formula)).toBe(false);
  });
});
