/** The sheets a home printer takes, in mm: ISO 216 A4 and US Letter (8.5 × 11 in). */
export const PAPERS = {
  a4: { name: 'A4', cssSize: 'A4', width: 210, height: 297 },
  letter: { name: 'US Letter', cssSize: 'letter', width: 215.9, height: 279.4 },
} as const;

export type Paper = keyof typeof PAPERS;

export const isPaper = (value: unknown): value is Paper => value === 'a4' || value === 'letter';

/** Page margin for every sheet; most home printers cannot print closer to the edge (common practice). */
export const PAGE_MARGIN_MM = 10;
export const LABEL_MM = { width: 70, height: 35 } as const;
/** The dashed cut line drawn around and between labels. */
export const CUT_LINE_MM = 0.2;

/** How many labels fit on one sheet, in whole columns and rows at true size. */
export function sheetGrid(paper: Paper): { columns: number; rows: number; perSheet: number } {
  const { width, height } = PAPERS[paper];
  const columns = Math.floor((width - 2 * PAGE_MARGIN_MM - CUT_LINE_MM) / (LABEL_MM.width + CUT_LINE_MM));
  const rows = Math.floor((height - 2 * PAGE_MARGIN_MM - CUT_LINE_MM) / (LABEL_MM.height + CUT_LINE_MM));
  return { columns, rows, perSheet: columns * rows };
}

/** Letter is the usual paper in the United States, Canada and Mexico (common practice); A4 elsewhere. */
export function defaultPaper(languages: readonly string[]): Paper {
  return languages.some((l) => /-(US|CA|MX)$/i.test(l)) ? 'letter' : 'a4';
}
