import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button, buttonStyles } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { FormAlert } from '../../../components/ui/form-alert';
import { paths } from '../../../config/paths';
import { formatDay } from '../../../lib/dates';
import { csvProblems, useImportLots, usePreviewLotsImport, type CsvRowProblem, type ImportPreview } from '../api/import-lots';
import { lotApiPaths } from '../api/keys';
import { TreatedCaution } from './lot-form-parts';
import { formatCount } from './lot-format';

function ProblemsTable({ rows }: { rows: CsvRowProblem[] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm sm:text-base">
        <caption className="sr-only">Problems in the file, by line</caption>
        <thead className="border-b border-loam-200 text-loam-700">
          <tr>
            <th scope="col" className="py-2 pr-3 font-semibold">Line</th>
            <th scope="col" className="py-2 pr-3 font-semibold">Column</th>
            <th scope="col" className="py-2 font-semibold">Problem</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-100">
          {rows.map((row, i) => (
            <tr key={`${row.line}-${row.column ?? ''}-${i}`}>
              <td className="py-2 pr-3 align-top font-semibold">{row.line}</td>
              <td className="py-2 pr-3 align-top break-all">{row.column ?? '—'}</td>
              <td className="py-2 align-top">{row.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function PreviewTable({ rows }: { rows: ImportPreview }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm sm:text-base">
        <caption className="sr-only">Lots the file would add</caption>
        <thead className="border-b border-loam-200 text-loam-700">
          <tr>
            <th scope="col" className="py-2 pr-3 font-semibold">Line</th>
            <th scope="col" className="py-2 pr-3 font-semibold">Lot</th>
            <th scope="col" className="hidden py-2 pr-3 font-semibold sm:table-cell">Harvest or season</th>
            <th scope="col" className="py-2 text-right font-semibold">Seeds</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-100">
          {rows.map((row) => (
            <tr key={row.line}>
              <td className="py-2 pr-3 align-top">{row.line}</td>
              <td className="py-2 pr-3 align-top">
                <span className="font-semibold">{row.species}</span> · {row.variety}
                <span className="block text-sm text-loam-600">{row.code ?? 'code made on import'}</span>
                {row.treated ? <span className="block text-sm font-semibold text-seedcoat-700">Treated seed</span> : null}
                <span className="block text-sm text-loam-600 sm:hidden">
                  {row.harvestDate ? formatDay(row.harvestDate) : row.packedForSeason ? `Packed for ${row.packedForSeason}` : ''}
                </span>
              </td>
              <td className="hidden py-2 pr-3 align-top sm:table-cell">
                {row.harvestDate ? formatDay(row.harvestDate) : row.packedForSeason ? `Packed for ${row.packedForSeason}` : '—'}
              </td>
              <td className="py-2 text-right align-top font-semibold">{formatCount(row.seedsOnHand)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Choose a CSV file → check it (nothing written) → import every row, or none if the server refuses. */
export function ImportLots({ bankId }: { bankId: string }) {
  const inputId = useId();
  const [file, setFile] = useState<File | null>(null);
  const preview = usePreviewLotsImport(bankId);
  const run = useImportLots(bankId);
  const failure = run.error ?? preview.error;
  const problems = csvProblems(failure);

  const choose = (next: File | null) => {
    setFile(next);
    preview.reset();
    run.reset();
    if (next) preview.mutate(next);
  };

  if (run.isSuccess) {
    return (
      <Card title="Imported">
        <FormAlert tone="success">
          {run.data === 1 ? '1 lot was' : `${formatCount(run.data)} lots were`} added to this bank.
        </FormAlert>
        <div className="mt-4 flex flex-wrap gap-2">
          <Link to={paths.lots.getHref(bankId)} className={buttonStyles()}>
            See the lots
          </Link>
          <Button variant="secondary" onClick={() => choose(null)}>
            Import another file
          </Button>
        </div>
      </Card>
    );
  }

  return (
    <div className="grid gap-5">
      <Card title="1. Choose a CSV file" description="The same columns as the export; up to 5 MB.">
        <div className="grid gap-2">
          <label htmlFor={inputId} className="font-semibold text-loam-900">
            CSV file
          </label>
          <input
            id={inputId}
            type="file"
            accept=".csv,text/csv"
            onClick={(event) => {
              // Choosing the same (corrected) file again must start a new check.
              event.currentTarget.value = '';
            }}
            onChange={(event) => choose(event.target.files?.[0] ?? null)}
            className="max-w-full text-base file:mr-3 file:min-h-11 file:cursor-pointer file:rounded-lg file:border file:border-loam-300 file:bg-white file:px-4 file:font-semibold"
          />
          <p className="text-sm text-loam-600">
            Not sure of the columns?{' '}
            <a href={lotApiPaths.csv(bankId)} download className="font-semibold text-moss-800 underline">
              Export the bank’s lots
            </a>{' '}
            and use that file as a template.
          </p>
        </div>
      </Card>

      {preview.isPending ? <FormAlert tone="info">Checking the file…</FormAlert> : null}

      {failure ? (
        <Card title={problems.length ? 'The file has problems' : 'Not imported'}>
          <div className="grid gap-3">
            <FormAlert title="Nothing was imported">{failure.message}</FormAlert>
            {problems.length ? <ProblemsTable rows={problems} /> : null}
            <p className="text-loam-700">Correct the file and choose it again.</p>
          </div>
        </Card>
      ) : null}

      {preview.isSuccess && !run.isError ? (
        <Card
          title="2. Check what will be added"
          description={`${preview.data.length === 1 ? '1 lot' : `${formatCount(preview.data.length)} lots`} in ${file?.name ?? 'the file'}. Nothing is saved yet.`}
        >
          <div className="grid gap-4">
            {preview.data.some((row) => row.treated) ? <TreatedCaution /> : null}
            {preview.data.length ? <PreviewTable rows={preview.data} /> : <p>The file has no lots in it.</p>}
            <div className="flex flex-wrap gap-2">
              <Button
                disabled={!file || preview.data.length === 0}
                isLoading={run.isPending}
                onClick={() => file && run.mutate(file)}
              >
                Import {preview.data.length === 1 ? '1 lot' : `${formatCount(preview.data.length)} lots`}
              </Button>
              <Link to={paths.lots.getHref(bankId)} className={buttonStyles({ variant: 'secondary' })}>
                Cancel
              </Link>
            </div>
          </div>
        </Card>
      ) : null}
    </div>
  );
}
