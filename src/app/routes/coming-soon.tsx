import { Link, useParams } from 'react-router-dom';
import { buttonStyles } from '../../components/ui/button';
import { EmptyState } from '../../components/ui/empty-state';
import { PageHeader } from '../../components/ui/page-header';
import { paths, type BankArea } from '../../config/paths';

const areas: Record<BankArea, { title: string; description: string; soon: string }> = {
  overview: {
    title: 'Overview',
    description: 'What needs doing in this bank this week.',
    soon: 'Trays to count, sowings that are due and lots worth retesting will gather here.',
  },
  lots: {
    title: 'Lots',
    description: 'Every seed lot in this bank, ranked by how well it is likely to come up.',
    soon: 'A sortable table of lots with their latest and projected germination, age and stock.',
  },
  planner: {
    title: 'Planner',
    description: 'The season’s sowings, counted back from the last frost date.',
    soon: 'A calendar of sow-by dates, seeds to sow and reminders for sowing and check days.',
  },
  members: {
    title: 'Members',
    description: 'Who shares this bank, and what each person may do in it.',
    soon: 'Owners, growers and viewers, with invitations by e-mail.',
  },
  settings: {
    title: 'Settings',
    description: 'Frost dates, test thresholds and the bank’s time zone.',
    soon: 'The dates and limits the planner and the ranking work from.',
  },
};

export interface ComingSoonPageProps {
  area: BankArea;
}

/** Stands in for a bank area that is not built yet. */
export function ComingSoonPage({ area }: ComingSoonPageProps) {
  const page = areas[area];
  const { bankId } = useParams();
  return (
    <>
      <PageHeader title={page.title} description={page.description} />
      <EmptyState
        title="Coming soon in this bank"
        description={page.soon}
        action={
          bankId && area !== 'members' ? (
            <Link to={paths.members.getHref(bankId)} className={buttonStyles({ variant: 'secondary' })}>
              See who shares this bank
            </Link>
          ) : (
            <Link to={paths.home.getHref()} className={buttonStyles({ variant: 'secondary' })}>
              Back to the start page
            </Link>
          )
        }
      />
    </>
  );
}
