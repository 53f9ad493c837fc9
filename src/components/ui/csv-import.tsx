import type { UseMutationResult } from '@tanstack/react-query';
import { useId, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '#src/lib/cn';
import { csvProblems, type CsvRowProblem } from '#src/lib/csv-import';
import { Button, buttonStyles } from './button';
import { Card } from './card';
import { FormAlert } from './form-alert';

/** A table of the file's lines: a hidden caption, column heads, then the rows given. */
export function CsvTable({
  caption,
  columns,
  children,
}: {
  caption: string;
  columns: { label: string; className?: string }[];
  children: ReactNode;
}) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm sm:text-base">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-loam-200 text-loam-700">
          <tr>
            {columns.map((column) => (
              <th
                key={column.label}
                scope="col"
                className={cn('py-2 pr-3 font-semibold last:pr-0', column.className)}
              >
                {column.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-100">{children}</tbody>
      </table>
    </div>
  );
}

function ProblemsTable({ rows }: { rows: CsvRowProblem[] }) {
  return (
    <CsvTable
      caption="Problems in the file, by line"
      columns={[{ label: 'Line' }, { label: 'Column' }, { label: 'Problem' }]}
    >
      {rows.map((row, i) => (
        <tr key={`${row.line}-${row.column ?? ''}-${i}`}>
          <td className="py-2 pr-3 align-top font-semibold">{row.line}</td>
          <td className="py-2 pr-3 align-top break-all">{row.column ?? '—'}</td>
          <td className="py-2 align-top">{row.message}</td>
        </tr>
      ))}
    </CsvTable>
  );
}

export interface CsvImportProps<Row> {
  /** Checks the file on the server (`?dryRun=true`): what it would add, nothing written. */
  preview: UseMutationResult<Row[], Error, File>;
  /** Imports every record in one transaction, or none. */
  run: UseMutationResult<number, Error, File>;
  /** "1 lot", "12 lots". */
  count: (n: number) => string;
  /** Under the file picker: where to get a file with the right columns. */
  template: ReactNode;
  /** Above the preview table, e.g. a caution some rows call for. */
  notice?: (rows: Row[]) => ReactNode;
  table: (rows: Row[]) => ReactNode;
  /** What an empty file holds: "The file has no lots in it." */
  empty: string;
  /** Where to go once it is imported, and where Cancel goes. */
  done: { href: string; label: string };
}

/** Choose a CSV file → check it (nothing written) → import every row, or none if the server refuses. */
export function CsvImport<Row>({
  preview,
  run,
  count,
  template,
  notice,
  table,
  empty,
  done,
}: CsvImportProps<Row>) {
  const inputId = useId();
  const [file, setFile] = useState<File | null>(null);
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
          {count(run.data)} {run.data === 1 ? 'was' : 'were'} added to this bank.
        </FormAlert>
        <div className="mt-4 flex flex-wrap gap-2">
          <Link to={done.href} className={buttonStyles()}>
            {done.label}
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
          <p className="text-sm text-loam-600">{template}</p>
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
          description={`${count(preview.data.length)} in ${file?.name ?? 'the file'}. Nothing is saved yet.`}
        >
          <div className="grid gap-4">
            {notice?.(preview.data)}
            {preview.data.length ? table(preview.data) : <p>{empty}</p>}
            <div className="flex flex-wrap gap-2">
              <Button
                disabled={!file || preview.data.length === 0}
                isLoading={run.isPending}
                onClick={() => file && run.mutate(file)}
              >
                Import {count(preview.data.length)}
              </Button>
              <Link to={done.href} className={buttonStyles({ variant: 'secondary' })}>
                Cancel
              </Link>
            </div>
          </div>
        </Card>
      ) : null}
    </div>
  );
}
