import { useState } from 'react';
import { LABELLING_DISTRIBUTED_SEED } from '#shared/cautions';
import { Button } from '#src/components/ui/button';
import { Caution } from '#src/components/ui/caution';
import { FormAlert } from '#src/components/ui/form-alert';
import { cn } from '#src/lib/cn';
import { bankPaths } from '#src/lib/bank-api';
import { CUT_LINE_MM, LABEL_MM, PAGE_MARGIN_MM, PAPERS, sheetGrid, type Paper } from './paper';
import { PrinterIcon } from './print-label-link';

export interface SheetLabel {
  lotId: string;
  /** What the label says, for people who cannot see it. */
  alt: string;
}

/**
 * The sheet's CSS. On screen each sheet is drawn as a page of the chosen paper; in print the app's
 * header, navigation and every control disappear and the page margin comes from @page, so each
 * label comes out at its true 70 × 35 mm with dashed cut lines around it.
 */
function sheetCss(paper: Paper): string {
  const { width, height, cssSize } = PAPERS[paper];
  const { columns } = sheetGrid(paper);
  const cut = `${CUT_LINE_MM}mm dashed #9e8d77`;
  return `
@page { size: ${cssSize}; margin: ${PAGE_MARGIN_MM}mm; }
.label-sheet { box-sizing: border-box; width: ${width}mm; min-height: ${height}mm; padding: ${PAGE_MARGIN_MM}mm; }
.label-sheet__grid { display: grid; grid-template-columns: repeat(${columns}, max-content); width: max-content; margin: 0 auto; border-top: ${cut}; border-left: ${cut}; list-style: none; padding: 0; }
.label-sheet__cell { box-sizing: content-box; width: ${LABEL_MM.width}mm; height: ${LABEL_MM.height}mm; border-right: ${cut}; border-bottom: ${cut}; break-inside: avoid; }
.label-sheet__cell img { display: block; width: ${LABEL_MM.width}mm; height: ${LABEL_MM.height}mm; }
@media print {
  html, body { background: #fff !important; }
  header, nav, [data-print="hide"] { display: none !important; }
  main > :not([data-print="root"]) { display: none !important; }
  main { padding: 0 !important; margin: 0 !important; max-width: none !important; }
  .min-h-dvh { min-height: 0 !important; }
  .label-sheets { overflow: visible !important; padding: 0 !important; }
  .label-sheet { width: auto; min-height: 0; padding: 0; margin: 0 !important; box-shadow: none !important; border: 0 !important; }
  .label-sheet:not(:last-child) { break-after: page; }
}`;
}

export interface LabelSheetProps {
  bankId: string;
  labels: readonly SheetLabel[];
  paper: Paper;
  onPaperChange: (paper: Paper) => void;
  /** Packets for giving seed away: germination with the test's month and year, and the labelling caution. */
  giving?: boolean;
  onGivingChange?: (giving: boolean) => void;
}

/**
 * The chosen lots' labels, laid out sheet by sheet for the chosen paper, with the paper choice and
 * the Print button above them. Print waits until every label has loaded, so no sheet comes out with
 * an empty frame.
 */
export function LabelSheet({
  bankId,
  labels,
  paper,
  onPaperChange,
  giving = false,
  onGivingChange,
}: LabelSheetProps) {
  const [settled, setSettled] = useState<Record<string, 'loaded' | 'failed'>>({});
  const { perSheet } = sheetGrid(paper);
  const sheets: SheetLabel[][] = [];
  for (let i = 0; i < labels.length; i += perSheet) sheets.push(labels.slice(i, i + perSheet));
  // Keyed by the picture's address: a shelf label and a giving packet of one lot load apart.
  const srcOf = (lotId: string) => bankPaths.lotLabel(bankId, lotId, giving);
  const waiting = labels.filter((l) => !settled[srcOf(l.lotId)]).length;
  const failed = labels.filter((l) => settled[srcOf(l.lotId)] === 'failed').length;

  const settle = (src: string, outcome: 'loaded' | 'failed') =>
    setSettled((prev) => (prev[src] === outcome ? prev : { ...prev, [src]: outcome }));

  return (
    <>
      <style>{sheetCss(paper)}</style>
      <div
        data-print="hide"
        className="mb-6 flex flex-col gap-4 rounded-xl border border-loam-200 bg-white p-4 sm:flex-row sm:items-end sm:justify-between"
      >
        <div className="flex flex-col gap-4 sm:flex-row sm:gap-6">
          <PaperChoice paper={paper} onChange={onPaperChange} />
          {onGivingChange ? <PurposeChoice giving={giving} onChange={onGivingChange} /> : null}
        </div>
        <div className="flex flex-col gap-2 sm:items-end">
          <Button onClick={() => window.print()} isLoading={waiting > 0} icon={<PrinterIcon />}>
            {waiting > 0 ? `Drawing labels (${labels.length - waiting} of ${labels.length})` : 'Print'}
          </Button>
        </div>
      </div>
      {giving ? (
        <div data-print="hide" className="mb-4 max-w-prose">
          <Caution title={LABELLING_DISTRIBUTED_SEED.title}>{LABELLING_DISTRIBUTED_SEED.text}</Caution>
        </div>
      ) : null}
      <p data-print="hide" className="mb-4 max-w-prose text-loam-700">
        {labels.length === 1 ? 'One label' : `${labels.length} labels`} on{' '}
        {sheets.length === 1 ? 'one sheet' : `${sheets.length} sheets`} of {PAPERS[paper].name}, {perSheet} to
        a sheet. In the print dialog choose actual size (100%), not “fit to page”, so each label comes out at
        70 × 35 mm; then cut along the dashed lines.
      </p>
      {failed > 0 ? (
        <div data-print="hide" className="mb-4">
          <FormAlert>
            {failed === 1 ? 'One label' : `${failed} labels`} could not be drawn. Reload the page to try
            again.
          </FormAlert>
        </div>
      ) : null}
      {/* Wider than a phone: it scrolls sideways, so it takes focus to scroll by keyboard too. */}
      <div
        className="label-sheets -mx-4 overflow-x-auto px-4 pb-4 sm:mx-0 sm:px-0"
        role="region"
        aria-label="Label sheets"
        tabIndex={0}
      >
        {sheets.map((sheet, index) => (
          <section
            key={index}
            aria-label={`Sheet ${index + 1} of ${sheets.length}`}
            className="label-sheet mx-auto mb-6 bg-white shadow-md shadow-loam-900/10 ring-1 ring-loam-200"
          >
            <ul className="label-sheet__grid">
              {sheet.map((label) => (
                <li key={label.lotId} className="label-sheet__cell">
                  {settled[srcOf(label.lotId)] === 'failed' ? (
                    <p className="flex h-full items-center justify-center p-3 text-center text-sm text-clay-800">
                      <span data-print="hide">This label could not be drawn.</span>
                    </p>
                  ) : (
                    <img
                      src={srcOf(label.lotId)}
                      alt={label.alt}
                      onLoad={() => settle(srcOf(label.lotId), 'loaded')}
                      onError={() => settle(srcOf(label.lotId), 'failed')}
                    />
                  )}
                </li>
              ))}
            </ul>
          </section>
        ))}
      </div>
    </>
  );
}

/** A row of large radio buttons, one per choice. */
function RadioChoice<K extends string>({
  legend,
  name,
  choices,
  value,
  onChange,
}: {
  legend: string;
  name: string;
  choices: readonly { key: K; label: string }[];
  value: K;
  onChange: (key: K) => void;
}) {
  return (
    <fieldset>
      <legend className="mb-2 font-semibold text-loam-900">{legend}</legend>
      <div className="flex flex-wrap gap-2">
        {choices.map(({ key, label }) => (
          <label
            key={key}
            className={cn(
              'inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border px-3 font-semibold',
              'has-[:focus-visible]:outline has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-frost-600',
              key === value
                ? 'border-moss-700 bg-moss-50 text-moss-800'
                : 'border-loam-300 bg-white text-loam-800 hover:bg-husk-100',
            )}
          >
            <input
              type="radio"
              name={name}
              value={key}
              checked={key === value}
              onChange={() => onChange(key)}
              className="size-4 accent-moss-700"
            />
            {label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function PaperChoice({ paper, onChange }: { paper: Paper; onChange: (paper: Paper) => void }) {
  return (
    <RadioChoice
      legend="Paper"
      name="paper"
      choices={(Object.keys(PAPERS) as Paper[]).map((key) => ({ key, label: PAPERS[key].name }))}
      value={paper}
      onChange={onChange}
    />
  );
}

const PURPOSES = [
  { key: 'shelf', label: 'Your shelf' },
  { key: 'giving', label: 'Giving seed away' },
] as const;

function PurposeChoice({ giving, onChange }: { giving: boolean; onChange: (giving: boolean) => void }) {
  return (
    <RadioChoice
      legend="Labels for"
      name="purpose"
      choices={PURPOSES}
      value={giving ? 'giving' : 'shelf'}
      onChange={(key) => onChange(key === 'giving')}
    />
  );
}
