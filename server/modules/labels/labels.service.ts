import type { Db } from '#server/db/database';
import { notFound } from '#server/http/errors';
import { lotsQuery, toLotDto } from '../lots/lots.shared.repository';
import { labelFontCss } from './label-font';
import { renderLabelSvg, type LabelContent } from './label-svg';
import { lastCountedAssay } from './labels.repository';

/** The lot page's address in the client, which the label's QR code opens. */
export function lotPageUrl(appOrigin: string, bankId: string, lotId: string): string {
  return `${appOrigin.replace(/\/+$/, '')}/banks/${encodeURIComponent(bankId)}/lots/${encodeURIComponent(lotId)}`;
}

export function createLabelsService({ db, appOrigin }: { db: Db; appOrigin: string }) {
  async function labelContent(bankId: string, lotId: string): Promise<LabelContent> {
    const row = await lotsQuery(db, bankId).where('lots.id', '=', lotId).executeTakeFirst();
    if (!row) throw notFound('No such lot.');
    const lot = toLotDto(row);
    const assay = await lastCountedAssay(db, bankId, lotId);
    return {
      code: lot.code,
      speciesName: lot.speciesName,
      scientificName: lot.scientificName,
      variety: lot.variety,
      harvestDate: lot.harvestDate,
      packedForSeason: lot.packedForSeason,
      lastAssay: assay
        ? {
            percent: assay.percent,
            estimated: assay.estimated,
            startDate: assay.start_date,
            running: assay.status === 'running',
          }
        : null,
      url: lotPageUrl(appOrigin, bankId, lotId),
    };
  }

  return {
    labelContent,
    /** The lot's packet label as an SVG document. */
    async lotLabelSvg(bankId: string, lotId: string): Promise<{ code: string; svg: string }> {
      const content = await labelContent(bankId, lotId);
      return { code: content.code, svg: renderLabelSvg(content, { fontCss: labelFontCss() }) };
    },
  };
}

export type LabelsService = ReturnType<typeof createLabelsService>;
