import { CsvImport, CsvTable } from '#src/components/ui/csv-import';
import { paths } from '#src/config/paths';
import { formatDay } from '#src/lib/dates';
import { useImportLots, usePreviewLotsImport, type ImportPreview } from '../api/import-lots';
import { bankPaths } from '#src/lib/bank-api';
import { TreatedCaution } from './lot-form-parts';
import { formatCount } from './lot-format';

const harvestOrSeason = (row: ImportPreview[number]) =>
  row.harvestDate
    ? formatDay(row.harvestDate)
    : row.packedForSeason
      ? `Packed for ${row.packedForSeason}`
      : null;

function PreviewTable({ rows }: { rows: ImportPreview }) {
  return (
    <CsvTable
      caption="Lots the file would add"
      columns={[
        { label: 'Line' },
        { label: 'Lot' },
        { label: 'Harvest or season', className: 'hidden sm:table-cell' },
        { label: 'Seeds', className: 'text-right' },
      ]}
    >
      {rows.map((row) => (
        <tr key={row.line}>
          <td className="py-2 pr-3 align-top">{row.line}</td>
          <td className="py-2 pr-3 align-top">
            <span className="font-semibold">{row.species}</span> · {row.variety}
            <span className="block text-sm text-loam-600">{row.code ?? 'code made on import'}</span>
            {row.treated ? (
              <span className="block text-sm font-semibold text-seedcoat-700">Treated seed</span>
            ) : null}
            <span className="block text-sm text-loam-600 sm:hidden">{harvestOrSeason(row) ?? ''}</span>
          </td>
          <td className="hidden py-2 pr-3 align-top sm:table-cell">{harvestOrSeason(row) ?? '—'}</td>
          <td className="py-2 text-right align-top font-semibold">
            {row.seedsOnHand === null ? 'Not known' : formatCount(row.seedsOnHand)}
          </td>
        </tr>
      ))}
    </CsvTable>
  );
}

const lotCount = (n: number) => (n === 1 ? '1 lot' : `${formatCount(n)} lots`);

/** Choose a lots CSV file → check it (nothing written) → import every row, or none. */
export function ImportLots({ bankId }: { bankId: string }) {
  return (
    <CsvImport
      preview={usePreviewLotsImport(bankId)}
      run={useImportLots(bankId)}
      count={lotCount}
      template={
        <>
          Not sure of the columns?{' '}
          <a href={bankPaths.lotsCsv(bankId)} download className="font-semibold text-moss-800 underline">
            Export the bank’s lots
          </a>{' '}
          and use that file as a template.
        </>
      }
      notice={(rows) => (rows.some((row) => row.treated) ? <TreatedCaution /> : null)}
      table={(rows) => <PreviewTable rows={rows} />}
      empty="The file has no lots in it."
      done={{ href: paths.lots.getHref(bankId), label: 'See the lots' }}
    />
  );
}
