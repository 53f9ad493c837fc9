import { lazy, Suspense } from 'react';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { useLotAssays } from '#src/features/germination/api/get-lot-assays';
import { LotAssays } from '#src/features/germination/components/lot-assays';
import { PrintLabelLink } from '#src/features/labels/components/print-label-link';
import { useLot } from '#src/features/lots/api/get-lot';
import { DeleteLotCard } from '#src/features/lots/components/delete-lot-card';
import { LotDetails } from '#src/features/lots/components/lot-details';
import { LotHeader } from '#src/features/lots/components/lot-header';
import { SeedAmountCard } from '#src/features/lots/components/seed-amount-card';
import { StockLedger } from '#src/features/lots/components/stock-ledger';
import { PhotoGallery, type FailedUpload } from '#src/features/photos/components/photo-gallery';
import { usePlants } from '#src/features/plants/api/get-plants';
import { PlantsList } from '#src/features/plants/components/plants-list';
import { useSpecies } from '#src/features/species/api/get-species';
import { SpeciesTraitsCard } from '#src/features/species/components/species-traits-card';
import { DeclineCard } from '#src/features/viability/components/decline-card';
import { FieldEmergenceCard } from '#src/features/viability/components/field-emergence-card';
import { LotAdviceCard } from '#src/features/viability/components/lot-advice-card';
import { SeedsToSowCard } from '#src/features/viability/components/seeds-to-sow-card';
import { StorageAdviceCard } from '#src/features/viability/components/storage-advice-card';
import { useSowingDate } from '#src/features/viability/components/use-sowing-date';
import { todayIn } from '#src/lib/dates';
import { useMe } from '#src/features/auth/api/get-me';
import type { BankNoticeState } from './bank-layout';
import { LotPageCautions } from './lot-cautions';
import { useRouteBank } from './use-route-bank';

// Packet pages: loaded with the lot page's extras, outside the first load.
const PacketPageCard = lazy(() => import('#src/features/packet/components/packet-page-card'));

// Generations: the lot's line as a small tree, loaded after the page.
const LineageCard = lazy(() => import('#src/features/lots/components/lineage-card'));
// Offers between banks: loaded only when a lot page opens.
const OfferCard = lazy(() => import('#src/features/offers/components/offer-card'));
const ReceivedCard = lazy(() => import('#src/features/offers/components/received-card'));
// Keeping the variety true: loads after the page.
const KeepingTrueCard = lazy(() => import('#src/features/plants/components/keeping-true-card'));

/** What the new-lot form hands over: the notice, and a photo upload that failed after saving. */
export interface LotPageState extends BankNoticeState {
  photoFailure?: FailedUpload;
}

export function LotPage() {
  const { bank, role } = useRouteBank();
  const { lotId = '' } = useParams();
  const location = useLocation();
  const navigate = useNavigate();
  const canEdit = role !== 'viewer';
  const { data: lot } = useLot(bank.id, lotId);
  const species = useSpecies(bank.id).data?.find((s) => s.id === lot.speciesId);
  const plants = usePlants(bank.id).data ?? [];
  const speciesPlants = plants.filter((p) => p.speciesId === lot.speciesId);
  const parents = plants.filter((p) => lot.parentPlantIds.includes(p.id));
  const photoFailure = (location.state as LotPageState | null)?.photoFailure;
  const today = todayIn(bank.timeZone);
  const sowing = useSowingDate(bank.lastFrost, today);
  const otherBanks = (useMe().data?.memberships ?? []).filter((m) => m.bankId !== bank.id);
  // The results of tests set aside, for the decline chart (the same cached list as the tests section).
  // Only counted ones: an estimated number sown has no Wilson interval to draw (it is listed apart).
  const lotAssays = useLotAssays(bank.id, lot.id).data?.items ?? [];
  const setAsideResults = Object.fromEntries(
    lotAssays.flatMap(({ test: assay, result }) =>
      assay.setAsideReason !== null &&
      !result.seedsSownEstimated &&
      result.germinated !== null &&
      result.sown !== null
        ? [[assay.id, { germinated: result.germinated, sown: result.sown }]]
        : [],
    ),
  );

  const actions = (
    <>
      <PrintLabelLink bankId={bank.id} lotIds={[lot.id]} />
      {canEdit ? (
        <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles({ variant: 'secondary' })}>
          New lot
        </Link>
      ) : null}
    </>
  );

  return (
    <>
      <LotHeader
        lot={lot}
        eyebrow={
          <Link to={paths.lots.getHref(bank.id)} className="underline">
            {bank.name} · Lots
          </Link>
        }
        actions={actions}
        actionsHiddenOnPhone
      />
      <LotPageCautions lot={lot} species={species} />
      {/*
        At the bench, a phone opens on what to do with the lot: its decision with the projected
        germination, and the seeds to sow (the Done-when of the phone layout is tested in
        tests/e2e/lot-phone.test.ts). Everything else follows.
      */}
      <div
        id="lot-bench"
        className="mb-6 grid items-start gap-4 sm:gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]"
      >
        <LotAdviceCard bankId={bank.id} lotId={lot.id} on={sowing.on} />
        <SeedsToSowCard
          key={lot.id}
          bankId={bank.id}
          lotId={lot.id}
          speciesId={lot.speciesId}
          startMethod={species?.traits.startMethod}
          on={sowing.on}
          onChangeOn={sowing.setOn}
          defaultAssurance={bank.sowingAssurance}
          canEdit={canEdit}
        />
      </div>
      {/* On a phone the page's actions come after the advice rather than before it. */}
      <div className="mb-6 flex flex-wrap gap-2 sm:hidden">{actions}</div>
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="grid min-w-0 gap-6">
          <Card title="Photos">
            <PhotoGallery
              key={lot.id}
              bankId={bank.id}
              subject="lot"
              subjectId={lot.id}
              canEdit={canEdit}
              failedUpload={photoFailure}
              describe={(i) => `Packet of ${lot.code}${i > 0 ? `, photo ${i + 1}` : ''}`}
            />
          </Card>
          <LotDetails
            key={lot.updatedAt}
            bankId={bank.id}
            lot={lot}
            plants={speciesPlants}
            canEdit={canEdit}
          />
          <SeedAmountCard bankId={bank.id} lot={lot} canEdit={canEdit} />
          <StockLedger bankId={bank.id} lotId={lot.id} canEdit={canEdit} today={today} />

          {/*
            Germination tests of this lot: the germination pages (src/features/germination) mount
            their list of this lot's tests in this section. Nothing else goes here.
          */}
          <section id="lot-tests" aria-labelledby="lot-tests-title">
            <LotAssays bankId={bank.id} lotId={lot.id} canWrite={canEdit} headingId="lot-tests-title" />
          </section>
          {/* A lot received from another bank shows the giver's tests, read-only. */}
          <Suspense fallback={null}>
            <ReceivedCard bankId={bank.id} lotId={lot.id} />
          </Suspense>
          {/* What came up from the lot's sowings: beside its tests, marked as not a test. */}
          <FieldEmergenceCard bankId={bank.id} lotId={lot.id} on={sowing.on} />
          <DeclineCard
            bankId={bank.id}
            lotId={lot.id}
            on={sowing.on}
            today={today}
            setAsideResults={setAsideResults}
          />
        </div>

        <div className="grid min-w-0 gap-6">
          <StorageAdviceCard
            bankId={bank.id}
            lotId={lot.id}
            on={sowing.on}
            place={lot.storage.place}
            temperatureC={lot.storage.temperatureC}
          />
          {species ? (
            <SpeciesTraitsCard bankId={bank.id} species={species} canEdit={canEdit} showCautions={false} />
          ) : null}
          <Card
            title="Parent plants"
            description={
              lot.plantsBulked
                ? `Seed bulked from ${lot.plantsBulked} plant${lot.plantsBulked === 1 ? '' : 's'}`
                : undefined
            }
          >
            {parents.length ? (
              <PlantsList
                bankId={bank.id}
                plants={parents}
                canEdit={false}
                label={`Parent plants of ${lot.code}`}
              />
            ) : (
              <p className="text-loam-700">No parent plants recorded for this lot.</p>
            )}
            <p className="mt-2 text-sm">
              <Link to={paths.plants.getHref(bank.id)} className="font-semibold text-moss-800 underline">
                All parent plants
              </Link>
            </p>
          </Card>
          <Suspense fallback={<Loading label="Loading the generations" />}>
            <LineageCard bankId={bank.id} lot={lot} />
          </Suspense>
          <Suspense fallback={null}>
            <KeepingTrueCard bankId={bank.id} lotId={lot.id} />
          </Suspense>
          {/* Give part of the lot to another bank. */}
          <Suspense fallback={null}>
            <OfferCard
              bankId={bank.id}
              lotId={lot.id}
              lotCode={lot.code}
              seedsOnHand={lot.seedsOnHand}
              otherBanks={otherBanks}
              canEdit={canEdit}
            />
          </Suspense>
          {/* The lot's public packet page. */}
          <Suspense fallback={<Loading label="Loading the packet page" />}>
            <PacketPageCard bankId={bank.id} lotId={lot.id} canEdit={canEdit} />
          </Suspense>
          {canEdit ? (
            <DeleteLotCard
              bankId={bank.id}
              lot={lot}
              onDone={(outcome) =>
                outcome.outcome === 'deleted'
                  ? void navigate(paths.lots.getHref(bank.id), {
                      replace: true,
                      state: { notice: `Lot ${lot.code} was deleted.` },
                    })
                  : void navigate(location.pathname, {
                      replace: true,
                      state: {
                        notice: `Lot ${lot.code} has germination tests, so it was retired instead of deleted.`,
                      },
                    })
              }
            />
          ) : null}
        </div>
      </div>
    </>
  );
}
