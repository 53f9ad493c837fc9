import { CsvImport, CsvTable } from '#src/components/ui/csv-import';
import { formatDay } from '#src/lib/dates';
import type { AssaysImportPreview } from '#shared/schemas/germination';
import { useImportAssays, usePreviewAssaysImport } from '../api/import-assays';
import { bankPaths } from '#src/lib/bank-api';

const count = new Intl.NumberFormat('en');
const assayCount = (n: number) => (n === 1 ? '1 germination test' : `${count.format(n)} germination tests`);
const plural = (n: number, one: string, many: string) => `${count.format(n)} ${n === 1 ? one : many}`;

function PreviewTable({ rows }: { rows: AssaysImportPreview }) {
  return (
    <CsvTable
      caption="Germination tests the file would add"
      columns={[
        { label: 'Line' },
        { label: 'Test' },
        { label: 'Started', className: 'hidden sm:table-cell' },
        { label: 'Trays' },
        { label: 'Counts' },
      ]}
    >
      {rows.map((row) => (
        <tr key={row.line}>
          <td className="py-2 pr-3 align-top">{row.line}</td>
          <td className="py-2 pr-3 align-top">
            <span className="font-semibold">{row.lotCode}</span> · {row.species} · {row.variety}
            <span className="block text-sm text-loam-600">{row.test}</span>
            <span className="block text-sm text-loam-600 sm:hidden">Started {formatDay(row.startDate)}</span>
          </td>
          <td className="hidden py-2 pr-3 align-top sm:table-cell">{formatDay(row.startDate)}</td>
          <td className="py-2 pr-3 align-top">
            {plural(row.trays, 'tray', 'trays')}
            <span className="block text-sm text-loam-600">{plural(row.seedsSown, 'seed', 'seeds')}</span>
          </td>
          <td className="py-2 align-top">
            {plural(row.checkDays, 'check day', 'check days')}
            <span className="block text-sm text-loam-600">
              {row.finishedOn ? `Finished ${formatDay(row.finishedOn)}` : 'Still running'}
            </span>
          </td>
        </tr>
      ))}
    </CsvTable>
  );
}

/** Choose a germination tests CSV file → check it (nothing written) → import every test, or none. */
export function ImportAssays({ bankId, doneHref }: { bankId: string; doneHref: string }) {
  return (
    <CsvImport
      preview={usePreviewAssaysImport(bankId)}
      run={useImportAssays(bankId)}
      count={assayCount}
      template={
        <>
          One line per tray and check day; lots are found by their code in this bank. A tray set aside
          (spilled, dried out) gives its reason in set_aside_reason and no finish figures; germination_percent
          is there to read and is not imported. Not sure of the columns?{' '}
          <a href={bankPaths.assaysCsv(bankId)} download className="font-semibold text-moss-800 underline">
            Export the bank’s tests
          </a>{' '}
          and use that file as a template.
        </>
      }
      table={(rows) => <PreviewTable rows={rows} />}
      empty="The file has no germination tests in it."
      done={{ href: doneHref, label: 'See the lots' }}
    />
  );
}
