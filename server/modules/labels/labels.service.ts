import type { Db } from '#server/db/database';
import { notFound } from '#server/http/errors';
import { lotsQuery, toLotDto } from '../lots/lots.shared.repository';
import { labelFontCss } from './label-font';
import { renderLabelSvg, type LabelContent } from './label-svg';

/** Text made safe for markup (XML or HTML): other modules' server-rendered pages use the labels' one escape. */
export { escapeXml as escapeMarkup } from './label-svg';
import { lastCountedAssay } from './labels.repository';

/** The lot page's address in the client, which the label's QR code opens. */
export function lotPageUrl(appOrigin: string, bankId: string, lotId: string): string {
  return `${appOrigin.replace(/\/+$/, '')}/banks/${encodeURIComponent(bankId)}/lots/${encodeURIComponent(lotId)}`;
}

export interface LabelsDeps {
  db: Db;
  appOrigin: string;
  /** The lot's public packet page while it is on (server/modules/packet), which the QR code then opens. */
  packetUrl?: (bankId: string, lotId: string) => Promise<string | null>;
}

export function createLabelsService({ db, appOrigin, packetUrl }: LabelsDeps) {
  async function labelContent(bankId: string, lotId: string, giving = false): Promise<LabelContent> {
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
      url: (await packetUrl?.(bankId, lotId)) ?? lotPageUrl(appOrigin, bankId, lotId),
      giving,
    };
  }

  return {
    labelContent,
    /** The lot's packet label as an SVG document: the shelf label, or a packet for giving seed away. */
    async lotLabelSvg(bankId: string, lotId: string, giving = false): Promise<{ code: string; svg: string }> {
      const content = await labelContent(bankId, lotId, giving);
      return { code: content.code, svg: renderLabelSvg(content, { fontCss: labelFontCss() }) };
    },
  };
}

export type LabelsService = ReturnType<typeof createLabelsService>;
