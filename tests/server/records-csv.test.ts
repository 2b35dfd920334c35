// The records' CSV for the food-safety file: RFC 4180 quoting (commas, quotes, line breaks in a
// note), one row per record, and a note a spreadsheet would run as a formula kept as text.
import { describe, expect, it } from 'vitest';
import type { BenchRecord } from '#shared/api';
import { recordsCsv } from '../../server/routes/records.ts';

const base: BenchRecord = {
  id: 7, date: '2026-12-03', target: 'harbour-ciabatta/1', kind: 'mix', label: 'Harbour ciabatta 1/2', formula: 'harbour-ciabatta', mixer: 'spiral',
  doughTemperature: 25.5, waterTemperature: 9, ripe: null, note: '', initials: 'MK', recordedAt: '2026-12-03T02:14:00.000Z',
  createdAt: '2026-12-03T02:14:03.000Z', by: { id: 3, name: 'Mara Kell', email: 'mara@tidewater.example' }, clientId: null, corrects: null,
  correctedBy: null, hidden: null, photos: [], friction: null,
};

describe('the records CSV', () => {
  it('quotes commas, quotes and line breaks as RFC 4180 says', async () => {
    const csv = await recordsCsv([{ ...base, note: 'slack, added 1 % water\nsaid "wet" twice' }]);
    const lines = csv.split('\r\n');
    expect(lines[0]).toBe('id,date,target,kind,formula,mixer,dough_temperature_c,water_temperature_c,ripe,note,initials,recorded_at,stored_at,by,corrects,corrected_by,photos');
    // RFC 4180 §2.6–2.7: a field with a comma, quote or line break is quoted, its quotes doubled.
    expect(csv).toContain('7,2026-12-03,harbour-ciabatta/1,mix,harbour-ciabatta,spiral,25.5,9,,"slack, added 1 % water\nsaid ""wet"" twice",MK,2026-12-03T02:14:00.000Z,2026-12-03T02:14:03.000Z,mara@tidewater.example,,,0\r\n');
  });

  it('writes a build\'s ripe as yes or no, and a correction\'s links', async () => {
    const csv = await recordsCsv([{ ...base, id: 8, kind: 'build', target: 'poolish', ripe: true, doughTemperature: 21, waterTemperature: null, corrects: 5, correctedBy: 9 }]);
    expect(csv.split('\r\n')[1]).toBe('8,2026-12-03,poolish,build,harbour-ciabatta,spiral,21,,yes,,MK,2026-12-03T02:14:00.000Z,2026-12-03T02:14:03.000Z,mara@tidewater.example,5,9,0');
  });

  it('keeps a note that starts like a formula as text', async () => {
    // OWASP, "CSV Injection": a cell starting with = + - @ is prefixed with a single quote.
    const csv = await recordsCsv([{ ...base, note: '=HYPERLINK("x")' }, { ...base, note: '-1 % water' }]);
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`);
    expect(csv).toContain(",'-1 % water,");
  });
});
