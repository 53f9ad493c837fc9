import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { HealthStatus } from '../../features/health/components/health-status';

const upcoming: ReadonlyArray<{ title: string; text: string }> = [
  {
    title: 'Log each lot',
    text: 'Species, variety, parent plants, harvest date, stock and a photo of the packet.',
  },
  {
    title: 'Test tray by tray',
    text: 'Count sprouts on each check day; Hilum works out the germination and its interval.',
  },
  {
    title: 'Sow from the frost date',
    text: 'Which lots to sow, how thickly, and when — counted back from your last frost.',
  },
];

export function HomePage() {
  return (
    <>
      <PageHeader
        eyebrow="Seed bank and germination ledger"
        title="Hilum is running"
        description="The app has loaded in this browser. The bank’s own pages arrive one by one; until then, here is how the server is doing."
      />
      <div className="grid gap-6">
        <HealthStatus />
        <Card title="What Hilum will keep for you">
          <ol className="grid gap-4 sm:grid-cols-3">
            {upcoming.map((item, index) => (
              <li key={item.title} className="flex gap-3">
                <span
                  aria-hidden="true"
                  className="num flex size-8 shrink-0 items-center justify-center rounded-full bg-seedcoat-100 font-bold text-seedcoat-800"
                >
                  {index + 1}
                </span>
                <div>
                  <p className="font-semibold text-loam-900">{item.title}</p>
                  <p className="text-loam-700">{item.text}</p>
                </div>
              </li>
            ))}
          </ol>
        </Card>
      </div>
    </>
  );
}
