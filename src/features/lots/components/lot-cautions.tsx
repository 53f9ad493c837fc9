import type { LotDto } from '#shared/schemas/lots';
import { SwapCaution, TreatedCaution } from './lot-form-parts';

/** The cautions a lot itself calls for (treated seed, a swap), for the top of its page. */
export function LotCautions({
  lot,
  foldOnPhone,
}: {
  lot: Pick<LotDto, 'treated' | 'origin'>;
  /** Titles only on a phone, each opening its text (the lot page's top). */
  foldOnPhone?: boolean;
}) {
  const notes = [
    lot.treated ? <TreatedCaution key="treated" foldOnPhone={foldOnPhone} /> : null,
    lot.origin === 'swapped' ? <SwapCaution key="swap" foldOnPhone={foldOnPhone} /> : null,
  ].filter(Boolean);
  return notes.length ? <>{notes}</> : null;
}
