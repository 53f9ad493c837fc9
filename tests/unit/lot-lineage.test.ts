import { describe, expect, it } from 'vitest';
import { buildLineage } from '#server/modules/lots/lot-lineage';
import { MAX_LINEAGE_DEPTH } from '#shared/schemas/lots';

// A lot's line from its rows (no database): generations counted as seed savers count them (seed
// not grown here starts a line at 1; seed saved from plants grown from lot X is X's generation + 1,
// common practice), with a cycle and an over-long line cut so that a read always ends.

type Rows = Parameters<typeof buildLineage>[1];
const lot = (id: string, plantsBulked: number | null = null) => ({
  id,
  code: id.toUpperCase(),
  variety: 'Test line',
  harvest_date: null,
  packed_for_season: 2026,
  plants_bulked: plantsBulked,
});
const parent = (lotId: string, plantId: string, from: string | null, hybrid = false) => ({
  lot_id: lotId,
  plant_id: plantId,
  label: plantId,
  hybrid,
  grown_from_lot_id: from,
  grown_from_code: from ? from.toUpperCase() : null,
});

describe('buildLineage', () => {
  it('when a lot has no parents grown here, then it is generation 1 with nothing before it', () => {
    const rows: Rows = { lots: [lot('a', 9)], parents: [parent('a', 'p1', null)] };
    expect(buildLineage('a', rows)).toEqual({
      generation: 1,
      population: 9,
      parents: [{ plantId: 'p1', label: 'p1', hybrid: false, grownFromLotId: null, code: null }],
      ancestors: [],
      cautions: [],
    });
  });

  it('when lines join (a diamond), then each ancestor is listed once, nearest first', () => {
    // a → (b, c) → d: b and c both grew from d; a from b and c.
    const rows: Rows = {
      lots: [lot('a'), lot('b'), lot('c'), lot('d', 20)],
      parents: [
        parent('a', 'pa1', 'b'),
        parent('a', 'pa2', 'c'),
        parent('b', 'pb', 'd'),
        parent('c', 'pc', 'd'),
      ],
    };
    const line = buildLineage('a', rows);
    expect(line.generation).toBe(3);
    expect(line.population).toBe(2); // two parent plants counted
    expect(line.ancestors.map((x) => [x.code, x.generation, x.population])).toEqual([
      ['B', 2, 1],
      ['C', 2, 1],
      ['D', 1, 20],
    ]);
    expect(line.ancestors.find((x) => x.code === 'B')!.grownFromLotIds).toEqual(['d']);
  });

  it('when the rows hold a cycle, then the line ends and the lot is not its own ancestor', () => {
    const rows: Rows = {
      lots: [lot('a'), lot('b')],
      parents: [parent('a', 'pa', 'b'), parent('b', 'pb', 'a')],
    };
    const line = buildLineage('a', rows);
    expect(line.ancestors.map((x) => x.lotId)).toEqual(['b']);
    expect(line.ancestors[0]!.grownFromLotIds).toEqual([]);
    expect(line.generation).toBe(2);
  });

  it('when a line is longer than the depth guard, then generations stop growing there', () => {
    const n = MAX_LINEAGE_DEPTH + 10;
    const ids = Array.from({ length: n }, (_, i) => `l${i}`);
    const rows: Rows = {
      lots: ids.map((id) => lot(id)),
      parents: ids.slice(0, -1).map((id, i) => parent(id, `p${i}`, ids[i + 1]!)),
    };
    const line = buildLineage('l0', rows);
    expect(line.generation).toBe(MAX_LINEAGE_DEPTH + 1);
  });

  it('when a parent plant was an F1 hybrid, then the line carries the hybrid caution', () => {
    const rows: Rows = { lots: [lot('a'), lot('b')], parents: [parent('a', 'pa', 'b', true)] };
    expect(buildLineage('a', rows).cautions.join(' ')).toMatch(/hybrid \(F1\).*will not come true/);
  });
});
