import { Link } from 'react-router-dom';
import { FormAlert } from '../../../components/ui/form-alert';
import { PageHeader } from '../../../components/ui/page-header';
import { paths } from '../../../config/paths';
import { ImportLots } from '../../../features/lots/components/import-lots';
import { SwapCaution } from '../../../features/lots/components/lot-form-parts';
import { useRouteBank } from './use-route-bank';

export function ImportLotsPage() {
  const { bank, role } = useRouteBank();
  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow={
          <Link to={paths.lots.getHref(bank.id)} className="underline">
            {bank.name} · Lots
          </Link>
        }
        title="Import lots from CSV"
        description="Hilum checks the whole file first and shows what it would add. Every row goes in, or none does."
      />
      {role === 'viewer' ? (
        <FormAlert tone="info">As a viewer you can export this bank’s lots but not import them.</FormAlert>
      ) : (
        <div className="grid gap-5">
          {/* A file of lots often comes from a swap or another circle. */}
          <SwapCaution />
          <ImportLots bankId={bank.id} />
        </div>
      )}
    </div>
  );
}
