import { useCallback, useMemo } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Button, buttonStyles } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { FormAlert } from '../../../components/ui/form-alert';
import { PageHeader } from '../../../components/ui/page-header';
import { Loading } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useLots } from '../../../features/lots/api/get-lots';
import { lotApiPaths, type LotFilters } from '../../../features/lots/api/keys';
import { LotsFilters } from '../../../features/lots/components/lots-filters';
import { LotsTable } from '../../../features/lots/components/lots-table';
import { useSpecies } from '../../../features/species/api/get-species';
import { filtersFromSearch, searchFromFilters } from './lots-search';
import { LotsSubnav } from './lots-subnav';
import { useRouteBank } from './use-route-bank';

export function LotsPage() {
  const { bank, role } = useRouteBank();
  const canEdit = role !== 'viewer';
  const [search, setSearch] = useSearchParams();
  const filters = useMemo(() => filtersFromSearch(search), [search]);
  const setFilters = useCallback(
    (next: LotFilters) => setSearch(searchFromFilters(next), { replace: true }),
    [setSearch],
  );
  const lots = useLots(bank.id, filters);
  const species = useSpecies(bank.id);
  const items = useMemo(() => lots.data?.pages.flatMap((p) => p.items) ?? [], [lots.data]);
  const filtered = Boolean(filters.q || filters.speciesId || filters.status);
  // The species filter lists only species the bank has lots of would need another request;
  // the full list (sorted by name) is short enough for a native select.
  const speciesOptions = useMemo(
    () => [...(species.data ?? [])].sort((a, b) => a.commonName.localeCompare(b.commonName)),
    [species.data],
  );

  const actions = (
    <>
      {canEdit ? (
        <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles()}>
          New lot
        </Link>
      ) : null}
      <a href={lotApiPaths.csv(bank.id)} download className={buttonStyles({ variant: 'secondary' })}>
        Export CSV
      </a>
      {canEdit ? (
        <Link to={paths.importLots.getHref(bank.id)} className={buttonStyles({ variant: 'secondary' })}>
          Import CSV
        </Link>
      ) : null}
    </>
  );

  const isEmptyBank = !filtered && lots.isSuccess && items.length === 0;

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="Lots"
        description="Every seed lot in this bank: where it came from, when, and how many seeds are left."
        actions={actions}
      />
      <LotsSubnav bankId={bank.id} />
      {isEmptyBank ? (
        <EmptyState
          title="No lots in this bank yet"
          description={
            canEdit
              ? 'Log your first lot at the bench: choose the species, say where the seed came from and how much there is, and take a photo of the packet. Have a spreadsheet already? Import it as CSV.'
              : 'Nobody has logged a lot here yet. Growers in this bank add lots; you will see them here.'
          }
          action={
            canEdit ? (
              <div className="flex flex-wrap justify-center gap-2">
                <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles()}>
                  Log the first lot
                </Link>
                <Link to={paths.importLots.getHref(bank.id)} className={buttonStyles({ variant: 'secondary' })}>
                  Import CSV
                </Link>
              </div>
            ) : undefined
          }
        />
      ) : (
        <div className="grid gap-4">
          <LotsFilters filters={filters} onChange={setFilters} species={speciesOptions} />
          {lots.isPending ? (
            <Loading label="Loading the lots" />
          ) : lots.isError ? (
            <FormAlert>{lots.error.message}</FormAlert>
          ) : items.length === 0 ? (
            <EmptyState
              title="No lots match"
              description="Try another word, or clear the filters."
              action={
                <Button variant="secondary" onClick={() => setFilters({})}>
                  Clear search and filters
                </Button>
              }
            />
          ) : (
            <>
              <p className="text-sm text-loam-700" aria-live="polite">
                {items.length === 1 ? '1 lot' : `${items.length} lots`}
                {lots.hasNextPage ? ' shown so far; sorting covers the lots shown' : ''}. “≈” marks a count estimated
                from a weight.
              </p>
              <LotsTable bankId={bank.id} lots={items} />
              {lots.hasNextPage ? (
                <div className="flex justify-center">
                  <Button variant="secondary" isLoading={lots.isFetchingNextPage} onClick={() => void lots.fetchNextPage()}>
                    Load more lots
                  </Button>
                </div>
              ) : null}
            </>
          )}
        </div>
      )}
    </>
  );
}
