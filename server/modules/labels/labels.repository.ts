import { sql } from 'kysely';
import type { DbOrTx } from '../../db/database';

export interface LastTestRow {
  start_date: string;
  status: 'running' | 'finished';
  sown: number;
  germinated: number;
}

/**
 * The lot's latest test by start date that is finished or has at least one count, with its pooled
 * totals: seeds sown over every tray, and each tray's last cumulative count summed (the same
 * pooling as the viability service's test aggregates).
 */
export async function lastCountedTest(
  db: DbOrTx,
  bankId: string,
  lotId: string,
): Promise<LastTestRow | null> {
  const { rows } = await sql<LastTestRow>`
    with latest as (
      select distinct on (c.tray_id) tr.test_id, c.cumulative
      from tray_counts c
      join test_trays tr on tr.id = c.tray_id
      join germination_tests t on t.id = tr.test_id
      where t.bank_id = ${bankId} and t.lot_id = ${lotId}
      order by c.tray_id, c.check_date desc
    ), counted as (
      select test_id, sum(cumulative)::int as germinated from latest group by test_id
    ), sown as (
      select tr.test_id, sum(tr.seeds_sown)::int as sown
      from test_trays tr join germination_tests t on t.id = tr.test_id
      where t.bank_id = ${bankId} and t.lot_id = ${lotId}
      group by tr.test_id
    )
    select t.start_date, t.status, sown.sown, coalesce(counted.germinated, 0)::int as germinated
    from germination_tests t
    join sown on sown.test_id = t.id
    left join counted on counted.test_id = t.id
    where t.bank_id = ${bankId} and t.lot_id = ${lotId} and sown.sown > 0
      and (t.status = 'finished' or counted.test_id is not null)
    order by t.start_date desc, t.created_at desc
    limit 1`.execute(db);
  return rows[0] ?? null;
}
