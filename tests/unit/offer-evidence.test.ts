import { describe, expect, it } from 'vitest';
import { evidenceResult, provenanceWords } from '#server/modules/offers/offers.service';

// What of a giver's stored test result crosses to the receiving bank (offers between
// banks): the figures and the trays' states, never the giver's tray ids nor the words the giver
// wrote when setting a tray aside.
describe('the evidence a received lot keeps', () => {
  const giverResult = {
    sown: 100,
    germinated: 91,
    percent: 91,
    interval: { low: 83.8, high: 95.2, method: 'wilson', confidence: 0.95 },
    trayPercents: [
      { id: '1b0f2c8e-0000-4000-8000-000000000001', state: 'counted', germinated: 46, setAsideReason: null },
      {
        id: '1b0f2c8e-0000-4000-8000-000000000002',
        state: 'set-aside',
        germinated: null,
        setAsideReason: 'The cat sat on it while I was at my sister’s',
      },
    ],
  };

  it('when a result is copied, then its figures stay and the giver’s tray ids and own words go', () => {
    const copied = evidenceResult(giverResult) as typeof giverResult;
    expect(copied.sown).toBe(100);
    expect(copied.germinated).toBe(91);
    expect(copied.interval).toEqual(giverResult.interval);
    expect(copied.trayPercents.map((t) => t.id)).toEqual(['tray-1', 'tray-2']);
    expect(copied.trayPercents.map((t) => t.state)).toEqual(['counted', 'set-aside']);
    expect(copied.trayPercents[1]!.setAsideReason).toBe('Set aside by the giver');
    expect(copied.trayPercents[0]!.setAsideReason).toBeNull();
    const text = JSON.stringify(copied);
    expect(text).not.toContain('cat sat');
    expect(text).not.toContain('1b0f2c8e');
  });

  it('when a result has no trays, then it is copied with none', () => {
    expect(evidenceResult({ sown: null })).toEqual({ sown: null, trayPercents: [] });
  });

  it('when the giver hides the bank’s name, then the provenance names only the lot’s code', () => {
    expect(provenanceWords('TOM-25-01', 'Hill Row Circle')).toBe('Lot TOM-25-01 of Hill Row Circle');
    expect(provenanceWords('TOM-25-01', null)).toBe('Lot TOM-25-01 of another Hilum bank');
  });
});
