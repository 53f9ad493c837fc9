import { Link } from 'react-router-dom';
import type { AssayDetail } from '#shared/schemas/germination';
import { buttonStyles } from '#src/components/ui/button';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import { useLotAssays } from '../api/get-lot-assays';
import { formatDate, intervalWords, resultFigure, traysSownWords } from './format';

export interface LotAssaysProps {
  bankId: string;
  lotId: string;
  /** Growers and owners may start a test. */
  canWrite: boolean;
  /** The heading's id, for a surrounding section's aria-labelledby. */
  headingId?: string;
}

function StatusBadge({ status }: { status: AssayDetail['test']['status'] }) {
  return (
    <span
      className={cn(
        'inline-flex items-center rounded-full px-2.5 py-0.5 text-sm font-semibold',
        status === 'running' ? 'bg-frost-100 text-frost-800' : 'bg-loam-100 text-loam-800',
      )}
    >
      {status === 'running' ? 'Running' : 'Finished'}
    </span>
  );
}

/** The germination tests of one lot, newest first, for the lot page. */
export function LotAssays({ bankId, lotId, canWrite, headingId }: LotAssaysProps) {
  const assays = useLotAssays(bankId, lotId);
  const startLink = canWrite ? (
    <Link to={paths.newAssay.getHref(bankId, lotId)} className={buttonStyles({ variant: 'primary' })}>
      Start a test
    </Link>
  ) : null;

  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id={headingId} className="text-xl font-bold text-loam-900">
          Germination tests
        </h2>
        {assays.data && assays.data.items.length > 0 ? startLink : null}
      </div>
      {assays.isPending ? (
        <Loading label="Reading the tests" />
      ) : assays.isError ? (
        <FormAlert title="The tests could not be read">{assays.error.message}</FormAlert>
      ) : assays.data.items.length === 0 ? (
        <EmptyState
          title="No tests yet"
          description="Sow a counted number of seeds in trays or on damp paper towels and count the normal seedlings on each check day."
          action={startLink ?? undefined}
        />
      ) : (
        <ul className="grid gap-3" aria-label="Germination tests of this lot">
          {assays.data.items.map((detail) => (
            <LotAssayItem key={detail.test.id} bankId={bankId} detail={detail} />
          ))}
        </ul>
      )}
    </div>
  );
}

function LotAssayItem({ bankId, detail }: { bankId: string; detail: AssayDetail }) {
  const { test: assay, result, trays } = detail;
  const range = intervalWords(result);
  return (
    <li>
      <Link
        to={paths.assay.getHref(bankId, assay.id)}
        className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2 rounded-xl border border-loam-200 bg-white p-4 no-underline shadow-sm hover:border-moss-400 hover:bg-moss-50"
      >
        <div className="min-w-0">
          <p className="flex flex-wrap items-center gap-2 font-bold text-loam-900">
            <span>Started {formatDate(assay.startDate)}</span>
            <StatusBadge status={assay.status} />
          </p>
          <p className="text-sm text-loam-700">
            {traysSownWords(trays)} · {assay.method}
            {assay.finishedOn ? ` · finished ${formatDate(assay.finishedOn)}` : ''}
          </p>
        </div>
        <div className="flex items-baseline gap-2 sm:block sm:text-right">
          <p className="num text-3xl font-bold leading-none text-moss-800">{resultFigure(result)}</p>
          <p className="text-sm text-loam-700">
            {range ? `${assay.status === 'running' ? 'so far, ' : ''}${range}` : 'no counts yet'}
          </p>
        </div>
      </Link>
    </li>
  );
}
