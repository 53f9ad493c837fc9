import { Link } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { useGrowOut } from '../api/get-grow-out';

const metres = (m: number) => `${Math.round(m).toLocaleString('en')} m`;

/**
 * The grow-out list: lots the advice calls "grow out" (fresh seed needed), with the plants a sound
 * seed crop needs, so next summer's seed crop is planned in spring. Loaded after the page (lazy).
 */
export function GrowOutCard({ bankId, headingLevel = 2 }: { bankId: string; headingLevel?: 2 | 3 }) {
  const query = useGrowOut(bankId);
  const data = query.data;
  return (
    <Card
      title="Grow out for fresh seed"
      headingLevel={headingLevel}
      description="Varieties whose seed is fading or running short, with no younger lot: sow them this season and save seed from enough plants."
      id="grow-out"
    >
      {query.isPending ? (
        <Loading label="Finding varieties to grow out" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : data && data.items.length === 0 ? (
        <p className="text-loam-700">No variety needs growing out for fresh seed this season.</p>
      ) : data ? (
        <ul aria-label="Varieties to grow out" className="divide-y divide-loam-100">
          {data.items.map((item) => (
            <li key={item.lotId} className="grid gap-1 py-3" data-grow-out={item.code}>
              <p className="font-bold text-loam-900">
                {item.species} · {item.variety}{' '}
                <Link
                  to={paths.lot.getHref(bankId, item.lotId)}
                  className="font-semibold text-moss-800 underline"
                >
                  {item.code}
                </Link>
              </p>
              <p className="text-sm text-loam-800" data-plants-for-seed>
                {item.plantsForSeed === null
                  ? 'Grow as many plants as you can for seed (the species’ number is not known).'
                  : `Grow at least ${item.plantsForSeed} plants for seed`}
                {item.isolationMeters !== null && item.pollination !== 'self'
                  ? `, about ${metres(item.isolationMeters)} from other varieties of ${item.species.toLowerCase()}`
                  : ''}
                {item.biennial
                  ? `. A biennial: sow in ${data.season}, keep the plants through the winter, seed in ${item.seedSeason}.`
                  : `; seed in ${item.seedSeason}.`}
              </p>
              <details className="text-sm text-loam-700">
                <summary className="cursor-pointer">Why</summary>
                <p className="mt-1">{item.reason}</p>
              </details>
            </li>
          ))}
        </ul>
      ) : null}
    </Card>
  );
}

export default GrowOutCard;
