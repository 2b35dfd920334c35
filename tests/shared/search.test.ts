import { describe, expect, it } from 'vitest';
import { matchesSearch, searchWords } from '#shared/search';

const text = 'harbour-ciabatta\nharbour ciabatta\nlean\nbread flour\nwater\nfine salt\npoolish';

describe('matchesSearch', () => {
  it.each([
    ['ciabatta', true], // exact word
    ['CIAB', true], // part of a word, any case
    ['harbor', true], // one typo in a 6-letter word
    ['ciabata', true], // one letter missing
    ['harbr ciabbatta', true], // typos in both words, each within its allowance
    ['poolsih', true], // two letters swapped count as one edit
    ['harb0', true], // the start of a word, one typo, while typing
    ['rye', false], // short words must match exactly
    ['focaccia', false], // another bread, not a typo
    ['ciabatta rye', false], // every word must be found
  ])('%j → %s', (q, found) => {
    expect(matchesSearch(searchWords(q), text)).toBe(found);
  });

  it('finds everything for an empty search', () => {
    expect(matchesSearch(searchWords('  '), text)).toBe(true);
  });
});
