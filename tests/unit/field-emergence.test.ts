import { describe, expect, it } from 'vitest';
import { cameUpWords, lookWords } from '#src/lib/emergence-words';
import { fieldEmergence } from '#server/modules/viability/field-emergence';
import type { EmergenceRow } from '#server/modules/plan/plan.shared.repository';

const row = (over: Partial<EmergenceRow>): EmergenceRow => ({
  id: 'r1',
  plan_entry_id: 'e1',
  lot_id: 'l1',
  species_id: 's1',
  sown_on: '2027-03-28',
  seeds_sown: 40,
  date: '2027-04-08',
  seedlings: 26,
  score: null,
  latest: true,
  ...over,
});

describe('what came up from sowings, as the viability fit reads it', () => {
  it('when a sowing was looked at twice, then both are history and only the latest is evidence, aged at the sowing day', () => {
    const ageAt = (date: string) => (date === '2027-03-28' ? 1.5 : Number.NaN);
    const { points, evidence } = fieldEmergence(
      [
        row({ id: 'early', date: '2027-04-02', seedlings: 10, latest: false }),
        row({ id: 'late', date: '2027-04-09', seedlings: 26 }),
        row({ id: 'other', plan_entry_id: 'e2', seedlings: null, score: 'few' }),
      ],
      ageAt,
      2,
    );
    expect(points.map((p) => [p.id, p.latest, p.ageYears])).toEqual([
      ['early', false, 1.5],
      ['late', true, 1.5],
      ['other', true, 1.5],
    ]);
    // Equivalent age: calendar years at the sowing × the storage's rate factor (2 here).
    expect(evidence).toEqual([
      {
        id: 'emergence:late',
        age: 3,
        alive: 26,
        sown: 40,
        evidence: { kind: 'emergence', emergence: { seedlings: 26 } },
      },
      {
        id: 'emergence:other',
        age: 3,
        alive: 0,
        sown: 40,
        evidence: { kind: 'emergence', emergence: { score: 'few' } },
      },
    ]);
  });

  it('when it is put in words, then it says the sowing, what came up and when', () => {
    expect(
      cameUpWords({ sownOn: '2027-03-12', seedsSown: 40, date: '2027-03-28', seedlings: 26, score: null }),
    ).toBe('Sown 40 on 12 Mar 2027; 26 came up by 28 Mar (65%)');
    expect(
      lookWords({ sownOn: '2026-12-30', seedsSown: 40, date: '2027-01-08', seedlings: null, score: 'half' }),
    ).toBe('about half came up by 8 Jan 2027');
  });
});
