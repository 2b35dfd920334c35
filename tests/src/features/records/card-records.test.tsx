// What a mix card shows of its records: the figures, who and when, corrections as new entries
// ("corrected by … at …"), hidden ones marked for the owner, what waits on the tablet.
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { SheetBuild, SheetMix } from '#shared/sheet/types';
import type { BenchRecord, RecordTarget } from '../../../../src/features/records/api/types.ts';
import { CardRecords } from '../../../../src/features/records/components/card-records.tsx';
import { timeOfDay, type PendingRecord } from '../../../../src/features/records/outbox.ts';
import { targetForBuild, targetForMix } from '../../../../src/features/records/targets.ts';

const target: RecordTarget = { target: 'harbour-ciabatta/1', kind: 'mix', label: 'Harbour ciabatta 1/2', formula: 'harbour-ciabatta', formulas: ['harbour-ciabatta'], mixer: 'spiral', doughTemperature: 24, waterTemperature: 9.5, start: '2026-12-03T01:10' };

function record(id: number, over: Partial<BenchRecord> = {}): BenchRecord {
  return {
    id, date: '2026-12-03', target: target.target, kind: 'mix', label: target.label, formula: 'harbour-ciabatta', mixer: 'spiral',
    doughTemperature: 25.5, waterTemperature: 11, ripe: null, note: '', initials: 'MK', recordedAt: '2026-12-03T02:14:00.000Z', createdAt: '2026-12-03T02:14:03.000Z',
    by: { id: 4, name: 'Mara Kell', email: 'bench@tidewater.example' }, clientId: null, corrects: null, correctedBy: null, hidden: null, photos: [], friction: null, ...over,
  };
}

function render(props: Partial<Parameters<typeof CardRecords>[0]>): string {
  return renderToStaticMarkup(
    <QueryClientProvider client={new QueryClient()}>
      <CardRecords date="2026-12-03" target={target} records={[]} pending={[]} canWrite canHide={false} {...props} />
    </QueryClientProvider>,
  );
}

describe('a card’s records', () => {
  it('offers to record a mix that has none, to bench staff who may write', () => {
    expect(render({})).toContain('Record this mix');
    expect(render({ canWrite: false })).not.toContain('Record this mix');
  });

  it('shows a correction as a new entry and the old one as corrected by whom and when', () => {
    const old = record(1, { correctedBy: 2, doughTemperature: 52 });
    const fix = record(2, { corrects: 1, initials: 'JT', createdAt: '2026-12-03T04:12:00.000Z', recordedAt: '2026-12-03T02:14:00.000Z' });
    const html = render({ records: [old, fix] });
    expect(html).toContain(`corrected by JT at ${timeOfDay(new Date('2026-12-03T04:12:00.000Z'))}`);
    expect(html).toContain('data-state="corrected"');
    expect(html).toContain('correction of');
    expect(html).toContain('dough 25.5 °C · water 11.0 °C');
    expect(html).toContain('Record again');
  });

  it('marks a hidden record for the owner, with who hid it and why', () => {
    const hidden = record(3, { hidden: { by: 'admin@tidewater.example', at: '2026-12-03T05:00:00.000Z', reason: 'wrong dough' } });
    const html = render({ records: [hidden], canHide: true });
    expect(html).toContain('data-state="hidden"');
    expect(html).toContain('hidden by admin@tidewater.example');
    expect(html).toContain('wrong dough');
  });

  it('shows photo previews linking to the full photo', () => {
    const withPhoto = record(4, { photos: [{ n: 1, contentType: 'image/jpeg', width: 2048, height: 1536, bytes: 1000, url: '/api/records/4/photos/1', previewUrl: '/api/records/4/photos/1?size=preview' }] });
    const html = render({ records: [withPhoto] });
    expect(html).toContain('src="/api/records/4/photos/1?size=preview"');
    expect(html).toContain('href="/api/records/4/photos/1"');
  });

  it('shows what waits on the tablet, and what the server would not take', () => {
    const waiting: PendingRecord = {
      clientId: 'k-1', date: '2026-12-03', target: target.target, label: target.label, savedAt: '2026-12-03T02:15:00.000Z', refused: null, photos: [],
      fields: { kind: 'mix', doughTemperature: 26, waterTemperature: null, ripe: null, note: 'stiff', initials: 'MK', recordedAt: '2026-12-03T02:15:00.000Z', corrects: null },
    };
    const html = render({ pending: [waiting, { ...waiting, clientId: 'k-2', refused: 'not on the sheet' }] });
    expect(html).toContain('Waiting to send');
    expect(html).toContain('Not sent');
    expect(html).toContain('The server would not take it: not on the sheet');
  });
});

describe('which target a sheet card is', () => {
  const mix = { formula: 'harbour-ciabatta', order: 0, mixNumber: 1, start: '2026-12-03T01:10', mixer: 'spiral' } as SheetMix;
  it('is the target of the same formula, start and mixer', () => {
    const later = { ...target, target: 'harbour-ciabatta/2', start: '2026-12-03T01:40' };
    expect(targetForMix([later, target], mix)?.target).toBe('harbour-ciabatta/1');
  });
  it('is none when that is not one target', () => {
    expect(targetForMix([target, { ...target, target: 'harbour-ciabatta/2' }], mix)).toBeUndefined();
    expect(targetForMix([], mix)).toBeUndefined();
  });
  it('names a build by its name, and among several of that name by formula and start', () => {
    const poolish = { ...target, kind: 'build' as const, target: 'poolish', label: 'poolish', start: '2026-12-02T14:00' };
    const levain1 = { ...target, kind: 'build' as const, target: 'levain/1', formula: 'tidewater-baguette', start: '2026-12-02T10:00' };
    const levain2 = { ...target, kind: 'build' as const, target: 'levain/2', formula: 'tidewater-baguette', start: '2026-12-02T14:22' };
    const build = (over: Partial<SheetBuild>) => ({ name: 'levain', formula: 'tidewater-baguette', batch: 1, batches: 2, booked: null, mixFrom: null, mixUntil: '2026-12-02T10:00', ...over }) as SheetBuild;
    expect(targetForBuild([poolish, levain1, levain2], build({ name: 'poolish', formula: 'harbour-ciabatta' }))?.target).toBe('poolish');
    expect(targetForBuild([poolish, levain1, levain2], build({ batch: 2, mixFrom: '2026-12-02T14:22' }))?.target).toBe('levain/2');
    expect(targetForBuild([poolish, levain1, levain2], build({ booked: { mixer: 'spiral', start: '2026-12-02T10:00', end: '2026-12-02T10:10' } }))?.target).toBe('levain/1');
  });
});
