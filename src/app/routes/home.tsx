import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { EmptyState } from '#src/components/ui/empty-state';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';

const upcoming: ReadonlyArray<{ title: string; text: string }> = [
  {
    title: 'Log each lot',
    text: 'Species, variety, parent plants, harvest date, stock and a photo of the packet.',
  },
  {
    title: 'Test tray by tray',
    text: 'Count the healthy seedlings on each check day; Hilum works out the germination and its interval.',
  },
  {
    title: 'Sow from the frost date',
    text: 'Which lots to sow, how thickly, and when — counted back from your last frost.',
  },
];

/**
 * `/` for someone who belongs to no bank yet (everyone else is sent on to their bank's overview
 * by the route's loader).
 */
export function HomePage() {
  const me = useMe();
  const firstName = me.data?.user.name.split(' ')[0];
  return (
    <>
      <PageHeader
        eyebrow="Welcome to Hilum"
        title={firstName ? `Good to see you, ${firstName}` : 'Welcome'}
        description="Everything in Hilum lives in a seed bank: one household’s collection, or a circle’s shared one."
      />
      <div className="grid gap-6">
        <EmptyState
          title="You are not in a seed bank yet"
          description="Start one for your own seeds — you will be its owner and can invite others. If someone invited you to theirs, open the link in their e-mail and it will bring you straight in."
          action={
            <Link to={paths.newBank.getHref()} className={buttonStyles({ size: 'lg' })}>
              Start a new bank
            </Link>
          }
        />
        <Card title="What a bank keeps for you">
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
