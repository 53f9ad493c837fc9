import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { EmptyState } from '#src/components/ui/empty-state';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';

export function NotFoundContent() {
  return (
    <>
      <PageHeader eyebrow="Not found" title="Nothing grows at this address" />
      <EmptyState
        title="This page does not exist"
        description="The link may be old, or the lot, test or bank may have been moved or removed — or you may not be a member of the bank it belongs to."
        action={
          <Link to={paths.home.getHref()} className={buttonStyles()}>
            Go to the start page
          </Link>
        }
      />
    </>
  );
}

export function NotFoundPage() {
  return <NotFoundContent />;
}
